import { createHash } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import matter from "gray-matter";
import { parseBody } from "./body";
import { frontMatterSchema, type Lesson } from "./schema";

/** One problem in one lesson file, named by file and field. */
export interface LessonIssue {
  file: string;
  path: string;
  message: string;
}

export class LessonValidationError extends Error {
  constructor(public issues: LessonIssue[]) {
    super(
      `${issues.length} problem${issues.length === 1 ? "" : "s"} in the lesson files:\n` +
        issues.map((i) => `  ${i.file}: ${i.path}: ${i.message}`).join("\n"),
    );
    this.name = "LessonValidationError";
  }
}

const FILE_NAME = /^(\d{2,3})-([a-z0-9]+(?:-[a-z0-9]+)*)\.md$/;

/** The course folder: LESSONS_DIR, else `lessons/` at the project root (where the server runs). */
export function lessonsDir(): string {
  return path.resolve(process.env.LESSONS_DIR ?? path.join(process.cwd(), "lessons"));
}

/**
 * Reads one lesson file's text. Slug and position come from the file name (`03-outlets.md`);
 * the version is the SHA-256 of the file's bytes.
 */
export function parseLessonFile(file: string, source: string): { lesson: Lesson | null; issues: LessonIssue[] } {
  const name = path.basename(file);
  const issue = (p: string, message: string): LessonIssue => ({ file: name, path: p, message });
  const named = FILE_NAME.exec(name);
  if (!named)
    return {
      lesson: null,
      issues: [issue("(file name)", "must look like 03-short-slug.md (two or three digits, a dash, lower-case words)")],
    };
  let parsed: matter.GrayMatterFile<string>;
  try {
    // A fresh object each time: gray-matter caches by content and would hand back a shared one.
    parsed = matter(source, {});
  } catch (e) {
    const mark = (e as { mark?: { line?: number } }).mark;
    return {
      lesson: null,
      issues: [
        issue(
          `front matter${mark?.line != null ? ` line ${mark.line + 2}` : ""}`,
          `is not valid YAML: ${(e as Error).message.split("\n")[0]}`,
        ),
      ],
    };
  }
  const front = frontMatterSchema.safeParse(parsed.data);
  const issues: LessonIssue[] = [];
  if (!front.success) {
    for (const i of front.error.issues)
      issues.push(issue(i.path.length ? i.path.join(".") : "(front matter)", i.message));
  }
  const bodyStart = source.split("\n").length - parsed.content.split("\n").length + 1;
  const body = parseBody(parsed.content, bodyStart);
  for (const i of body.issues) issues.push(issue(i.path, i.message));
  if (!body.blocks.some((b) => b.type === "roof"))
    issues.push(issue("body", "needs at least one ```roof figure drawn by the app"));
  if (issues.length || !front.success) return { lesson: null, issues };
  const version = createHash("sha256").update(source, "utf8").digest("hex");
  return {
    lesson: { ...front.data, slug: named[2], position: Number(named[1]), version, file: name, blocks: body.blocks },
    issues: [],
  };
}

/** Reads and validates every lesson in the folder; throws one error that lists every problem. */
export function loadLessons(dir = lessonsDir()): Lesson[] {
  let names: string[];
  try {
    names = fs
      .readdirSync(dir)
      .filter((f) => f.endsWith(".md") && f.toLowerCase() !== "readme.md")
      .sort();
  } catch {
    throw new LessonValidationError([
      { file: dir, path: "(folder)", message: "cannot be read: is LESSONS_DIR right?" },
    ]);
  }
  const lessons: Lesson[] = [];
  const issues: LessonIssue[] = [];
  for (const name of names) {
    const r = parseLessonFile(name, fs.readFileSync(path.join(dir, name), "utf8"));
    issues.push(...r.issues);
    if (r.lesson) lessons.push(r.lesson);
  }
  const seen = new Map<string, string>();
  for (const l of lessons) {
    const other = seen.get(l.slug);
    if (other) issues.push({ file: l.file, path: "(file name)", message: `slug "${l.slug}" is also used by ${other}` });
    seen.set(l.slug, l.file);
  }
  if (issues.length) throw new LessonValidationError(issues);
  return lessons.sort((a, b) => a.position - b.position || a.slug.localeCompare(b.slug));
}
