/**
 * The names of what failed, read from vitest's and Playwright's JSON reports, so `npm test` can list them
 * beside its last line (a CI log is often read from its end).
 */
import path from "node:path";
import { stripVTControlCharacters } from "node:util";

export const firstLine = (text: string | undefined) =>
  stripVTControlCharacters(text ?? "")
    .split("\n")
    .find((l) => l.trim())
    ?.trim()
    .slice(0, 240) ?? "";

interface VitestReport {
  testResults: {
    name: string;
    status: string;
    message?: string;
    assertionResults: { fullName: string; status: string; failureMessages?: string[] }[];
  }[];
}

/** Each failed, skipped or broken test of vitest's JSON report, as `file › name: first line of its error`. */
export function vitestFailures(r: VitestReport, root: string): string[] {
  const out: string[] = [];
  for (const file of r.testResults) {
    const where = path.relative(root, file.name);
    const bad = file.assertionResults.filter((a) => a.status !== "passed" && a.status !== "todo");
    for (const a of bad)
      out.push(`vitest ${where} › ${a.fullName} (${a.status}): ${firstLine(a.failureMessages?.[0])}`);
    if (file.status === "failed" && bad.length === 0) out.push(`vitest ${where}: ${firstLine(file.message)}`);
  }
  return out;
}

interface PlaywrightSuite {
  title: string;
  file?: string;
  specs?: {
    title: string;
    file: string;
    line: number;
    tests: { projectName: string; status: string; results: { error?: { message?: string } }[] }[];
  }[];
  suites?: PlaywrightSuite[];
}

/** Each unexpected or skipped test of Playwright's JSON report, with its project, place and error's first line. */
export function playwrightFailures(r: { suites?: PlaywrightSuite[]; errors?: { message?: string }[] }): string[] {
  const out: string[] = [];
  const walk = (s: PlaywrightSuite) => {
    for (const spec of s.specs ?? [])
      for (const t of spec.tests)
        if (t.status === "unexpected" || t.status === "skipped") {
          const error = t.results.map((x) => x.error?.message).find(Boolean);
          out.push(
            `playwright [${t.projectName}] ${spec.file}:${spec.line} › ${spec.title} (${t.status}): ${firstLine(error)}`,
          );
        }
    for (const child of s.suites ?? []) walk(child);
  };
  for (const s of r.suites ?? []) walk(s);
  for (const e of r.errors ?? []) out.push(`playwright: ${firstLine(e.message)}`);
  return out;
}
