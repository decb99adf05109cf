import matter from "gray-matter";
import { marked } from "marked";
import sanitizeHtml from "sanitize-html";
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

/**
 * What rendered lesson Markdown may hold (docs/security.md, "Lesson bodies"): the tags Markdown
 * makes, links to http(s) and mail only, no script, style, frames, SVG or event handlers. Lessons
 * are written in the app by trainers of any organisation, so no lesson text is trusted.
 */
const SAFE_HTML: sanitizeHtml.IOptions = {
  allowedTags: [
    ...["p", "br", "hr", "h1", "h2", "h3", "h4", "h5", "h6", "blockquote", "pre", "code", "span", "div"],
    ...["strong", "b", "em", "i", "del", "s", "sub", "sup", "kbd", "mark", "small", "abbr"],
    ...["ul", "ol", "li", "dl", "dt", "dd", "a", "img"],
    ...["table", "thead", "tbody", "tfoot", "tr", "th", "td", "caption"],
    ...["input"],
  ],
  allowedAttributes: {
    a: ["href", "title"],
    img: ["src", "alt", "title", "width", "height"],
    code: ["class"],
    ol: ["start"],
    th: ["align"],
    td: ["align"],
    abbr: ["title"],
    // GFM task lists: a disabled checkbox.
    input: ["type", "checked", "disabled"],
  },
  allowedClasses: { code: [/^language-[\w-]+$/] },
  allowedSchemes: ["http", "https", "mailto"],
  allowedSchemesByTag: { img: ["https"] },
  allowProtocolRelative: false,
  disallowedTagsMode: "discard",
  exclusiveFilter: (frame) => frame.tag === "input" && frame.attribs.type !== "checkbox",
};

/** Rendered lesson HTML with everything outside SAFE_HTML taken out. */
export function safeHtml(html: string): string {
  return sanitizeHtml(html, SAFE_HTML);
}

/** Markdown rendered for the page, made safe: lessons are written by trainers in the app too. */
export function renderMarkdown(md: string): string {
  return keepUnitsTogether(safeHtml(marked.parse(md, { async: false, gfm: true }) as string));
}

export function renderInline(md: string): string {
  return keepUnitsTogether(safeHtml(marked.parseInline(md, { async: false, gfm: true }) as string));
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
