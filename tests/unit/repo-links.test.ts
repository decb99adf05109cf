import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

/**
 * The project's files point only inside the repository (docs/README.md): no path into a folder
 * beside the checkout, no bare name of a specification file that is not in the repository, and
 * every `docs/….md` a file cites exists, with the § section it names.
 */
const ROOT = path.resolve(import.meta.dirname, "../..");
const SELF = path.relative(ROOT, import.meta.filename);

const SKIP_DIRS = new Set([
  "node_modules",
  "build",
  ".git",
  ".data",
  ".react-router",
  "test-results",
  "playwright-report",
]);
const TEXT = /\.(ts|tsx|mts|mjs|cjs|js|md|json|ya?ml|css|html|sh|txt)$/;

function projectFiles(dir = ROOT, out: string[] = []): string[] {
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    if (SKIP_DIRS.has(entry.name)) continue;
    const full = path.join(dir, entry.name);
    const rel = path.relative(ROOT, full);
    if (entry.isDirectory()) projectFiles(full, out);
    else if ((TEXT.test(entry.name) || rel === path.join(".ci", "run")) && entry.name !== "package-lock.json")
      out.push(rel);
  }
  return out;
}

const files = projectFiles().filter((f) => f !== SELF);
const read = (rel: string) => fs.readFileSync(path.join(ROOT, rel), "utf8");

interface Hit {
  file: string;
  line: number;
  text: string;
}

function find(pattern: RegExp, only: (file: string) => boolean = () => true): Hit[] {
  const hits: Hit[] = [];
  for (const file of files.filter(only)) {
    read(file)
      .split("\n")
      .forEach((text, i) => {
        pattern.lastIndex = 0;
        if (pattern.test(text)) hits.push({ file, line: i + 1, text: text.trim().slice(0, 160) });
      });
  }
  return hits;
}

const show = (hits: Hit[]) => hits.map((h) => `${h.file}:${h.line}: ${h.text}`);

/** `docs/x.md` (optionally followed by § numbers) as cited from anywhere outside docs/. */
const DOC_CITE = /(?<![\w./-])docs\/([\w./-]+?\.md)((?:\s*§\s*\d+(?:\s*(?:,|and|\/)\s*§?\s*\d+)*)?)/g;

describe("pointers stay inside the repository", () => {
  it("finds the project's files to check (the walk itself works)", () => {
    expect(files).toContain(path.join("app", "routes.ts"));
    expect(files).toContain(path.join("docs", "roof-method.md"));
    expect(files.some((f) => f.startsWith("node_modules"))).toBe(false);
  });

  it("no file points to a folder beside the checkout", () => {
    const named = find(/\.\.\/shared\b|\bshared\/design\b/);
    // A relative path that climbs out of the checkout from the file that writes it.
    const climbing: Hit[] = [];
    for (const file of files) {
      read(file)
        .split("\n")
        .forEach((text, i) => {
          for (const m of text.matchAll(/(?<![\w.])(?:\.\.\/)+[\w@.-]*/g)) {
            const target = path.resolve(ROOT, path.dirname(file), m[0]);
            if (target !== ROOT && !target.startsWith(ROOT + path.sep))
              climbing.push({ file, line: i + 1, text: text.trim().slice(0, 160) });
          }
        });
    }
    expect(show([...named, ...climbing]), "paths that leave the repository: point into docs/ instead").toEqual([]);
  });

  it("no file names a specification file that is not in the repository", () => {
    // The upper-case names of the design notes the project started from; their content is in docs/.
    const bare = find(/(?<![\w/-])(?:ROOF-METHOD|CHECK-VALUES|QUALITY|PRODUCT|STYLE|STACK)(?:\.md\b|\b(?=\s*[§)]))/);
    expect(
      show(bare),
      "cite docs/roof-method.md, docs/check-values.md, docs/quality.md, docs/security.md or docs/product.md",
    ).toEqual([]);
  });

  it("every docs/….md that a file cites exists, and so does each § it names", () => {
    const missing: string[] = [];
    let cited = 0;
    for (const file of files.filter((f) => !f.startsWith(`docs${path.sep}`))) {
      read(file)
        .split("\n")
        .forEach((text, i) => {
          for (const m of text.matchAll(DOC_CITE)) {
            cited++;
            const target = path.join(ROOT, "docs", m[1]);
            if (!fs.existsSync(target)) {
              missing.push(`${file}:${i + 1}: docs/${m[1]} does not exist`);
              continue;
            }
            const sections = [...(m[2] ?? "").matchAll(/\d+/g)].map((d) => d[0]);
            const body = fs.readFileSync(target, "utf8");
            for (const s of sections) {
              // A numbered heading: "## 4. The surface", "### §4 ...", "## 4) ...".
              if (!new RegExp(`^#{2,4}\\s*§?\\s*${s}(?:[.):]|\\s)`, "m").test(body))
                missing.push(`${file}:${i + 1}: docs/${m[1]} has no section §${s}`);
            }
          }
        });
    }
    expect(cited, "the code cites docs/ in many places; none found means the pattern is broken").toBeGreaterThan(40);
    expect(missing).toEqual([]);
  });

  it("the citation pattern reads sections as people write them", () => {
    const sections = (s: string) =>
      [...s.matchAll(DOC_CITE)].map((m) => [m[1], [...(m[2] ?? "").matchAll(/\d+/g)].map((d) => d[0])]);
    expect(sections("(docs/roof-method.md §3, §7): H")).toEqual([["roof-method.md", ["3", "7"]]]);
    expect(sections("docs/roof-method.md §3/§4: H")).toEqual([["roof-method.md", ["3", "4"]]]);
    expect(sections("see docs/decisions/0003-reused-arena-memory.md.")).toEqual([
      ["decisions/0003-reused-arena-memory.md", []],
    ]);
    expect(sections("my-docs/x.md")).toEqual([]);
  });

  it("the docs index lists every document and decision in docs/", () => {
    const index = read(path.join("docs", "README.md"));
    const pages = fs.readdirSync(path.join(ROOT, "docs")).filter((f) => f.endsWith(".md") && f !== "README.md");
    const decisions = fs.readdirSync(path.join(ROOT, "docs", "decisions")).filter((f) => f.endsWith(".md"));
    const unlisted = [
      ...pages.filter((p) => !index.includes(`(${p})`)),
      ...decisions.filter((d) => !index.includes(`(decisions/${d})`)),
    ];
    expect(unlisted, "add these to docs/README.md").toEqual([]);
    expect(decisions.length).toBeGreaterThanOrEqual(7);
  });
});
