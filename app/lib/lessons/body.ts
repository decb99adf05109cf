import matter from "gray-matter";
import { marked } from "marked";
import { figureSchema, type Block } from "./schema";

export interface BodyIssue {
  /** Where in the file: "body line 42 (roof figure)". */
  path: string;
  message: string;
}

// gray-matter's own YAML reader (js-yaml, safe load); its typings leave `engines` out.
const yaml = (matter as unknown as { engines: { yaml: { parse(s: string): unknown } } }).engines.yaml;

const FENCE = /^```(roof|caution)[ \t]*\r?\n([\s\S]*?)^```[ \t]*$/gm;

/**
 * A number and its unit never part at a line end ("30 %", "16 m", "140 mm"): the space between
 * them becomes a no-break space (outside tags and entities only matter for text, which is all a
 * digit-space-unit run can be in the rendered HTML).
 */
export function keepUnitsTogether(html: string): string {
  return html.replace(/(\d) (%|mm\b|m²|m\b|°)/g, "$1\u00a0$2");
}

/** Markdown rendered for the page. Lesson files are trusted repository content, written by trainers. */
export function renderMarkdown(md: string): string {
  return keepUnitsTogether(marked.parse(md, { async: false, gfm: true }) as string);
}

export function renderInline(md: string): string {
  return keepUnitsTogether(marked.parseInline(md, { async: false, gfm: true }) as string);
}

/**
 * Splits a lesson body into Markdown, ```roof figures (YAML: caption, view, spec) and
 * ```caution boxes. `lineOffset` is the body's first line in the file, for messages.
 */
export function parseBody(body: string, lineOffset: number): { blocks: Block[]; issues: BodyIssue[] } {
  const blocks: Block[] = [];
  const issues: BodyIssue[] = [];
  let last = 0;
  const pushMarkdown = (md: string) => {
    if (md.trim()) blocks.push({ type: "html", html: renderMarkdown(md) });
  };
  for (const m of body.matchAll(FENCE)) {
    pushMarkdown(body.slice(last, m.index));
    last = m.index + m[0].length;
    const line = lineOffset + body.slice(0, m.index).split("\n").length - 1;
    const [, kind, content] = m;
    if (kind === "caution") {
      if (!content.trim()) issues.push({ path: `body line ${line} (caution)`, message: "is empty" });
      else blocks.push({ type: "caution", html: renderMarkdown(content) });
      continue;
    }
    let data: unknown;
    try {
      data = yaml.parse(content);
    } catch (e) {
      issues.push({
        path: `body line ${line} (roof figure)`,
        message: `is not valid YAML (text holding ": " must be in quotes): ${(e as Error).message.split("\n")[0]}`,
      });
      continue;
    }
    const figure = figureSchema.safeParse(data);
    if (!figure.success) {
      for (const i of figure.error.issues) {
        issues.push({
          path: `body line ${line} (roof figure)${i.path.length ? ` ${i.path.join(".")}` : ""}`,
          message: i.message,
        });
      }
      continue;
    }
    blocks.push({ type: "roof", figure: figure.data });
  }
  pushMarkdown(body.slice(last));
  return { blocks, issues };
}
