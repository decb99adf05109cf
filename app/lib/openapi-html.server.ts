/**
 * The OpenAPI document as one readable HTML page (GET /api/v1/docs): every operation with its
 * parameters, body and answers, then every schema. Plain HTML and one inline style sheet: no
 * script and nothing fetched from elsewhere, so it works offline and under the page CSP.
 */
import type { OpenApiDocument } from "~/lib/openapi.server";

const METHODS = ["get", "post", "put", "patch", "delete"] as const;

const escapeHtml = (text: string) =>
  text
    .replace(/&/g, "&amp;")
    .replace(/</g, "&lt;")
    .replace(/>/g, "&gt;")
    .replace(/"/g, "&quot;")
    .replace(/'/g, "&#39;");

const anchor = (text: string) =>
  text
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-|-$/g, "");
const schemaId = (name: string) => `schema-${anchor(name)}`;
const REF = /^#\/components\/schemas\/(.+)$/;

/** A schema as indented JSON, with every $ref a link to the schema's own section. */
function schemaBlock(schema: unknown): string {
  const text = escapeHtml(JSON.stringify(schema, null, 2));
  const linked = text.replace(
    /&quot;#\/components\/schemas\/([^&]+)&quot;/g,
    (_, name: string) => `<a href="#${schemaId(name)}">${name}</a>`,
  );
  return `<pre><code>${linked}</code></pre>`;
}

/** "Roof" for a $ref, else the schema written out. */
function schemaSummary(schema: unknown): string {
  const ref = (schema as { $ref?: string } | undefined)?.$ref?.match(REF);
  return ref ? `<a href="#${schemaId(ref[1])}">${escapeHtml(ref[1])}</a>` : schemaBlock(schema);
}

interface Parameter {
  name: string;
  in: string;
  required?: boolean;
  description?: string;
  schema?: unknown;
}

interface Operation {
  summary?: string;
  description?: string;
  security?: unknown[];
  parameters?: Parameter[];
  requestBody?: { required?: boolean; content?: Record<string, { schema?: unknown }> };
  responses?: Record<string, { description?: string; content?: Record<string, { schema?: unknown }> }>;
}

function operationHtml(method: string, path: string, op: Operation): string {
  const id = `op-${method}-${anchor(path)}`;
  const parts = [
    `<section class="op" id="${id}">`,
    `<h3><span class="method ${method}">${method.toUpperCase()}</span> <code>${escapeHtml(path)}</code></h3>`,
  ];
  if (op.summary) parts.push(`<p class="summary">${escapeHtml(op.summary)}</p>`);
  if (op.description) parts.push(`<p>${escapeHtml(op.description)}</p>`);
  parts.push(
    `<p class="auth">${op.security?.length ? "Needs a signed-in session (cookie <code>fw_session</code>)." : "Open to anyone."}</p>`,
  );
  if (op.parameters?.length) {
    parts.push(
      "<h4>Parameters</h4><table><thead><tr><th>name</th><th>in</th><th>required</th><th>schema</th><th>meaning</th></tr></thead><tbody>",
    );
    for (const p of op.parameters) {
      parts.push(
        `<tr><td><code>${escapeHtml(p.name)}</code></td><td>${escapeHtml(p.in)}</td><td>${p.required ? "yes" : "no"}</td>` +
          `<td><code>${escapeHtml(JSON.stringify(p.schema ?? {}))}</code></td><td>${escapeHtml(p.description ?? "")}</td></tr>`,
      );
    }
    parts.push("</tbody></table>");
  }
  for (const [type, media] of Object.entries(op.requestBody?.content ?? {})) {
    parts.push(
      `<h4>Request body <small>${escapeHtml(type)}${op.requestBody?.required ? ", required" : ""}</small></h4>`,
      schemaSummary(media.schema),
    );
  }
  parts.push("<h4>Answers</h4><dl>");
  for (const [status, response] of Object.entries(op.responses ?? {})) {
    const media = Object.values(response.content ?? {})[0];
    parts.push(
      `<dt><span class="status s${status[0]}">${escapeHtml(status)}</span></dt>` +
        `<dd>${escapeHtml(response.description ?? "")}${media?.schema ? ` ${schemaSummary(media.schema)}` : ""}</dd>`,
    );
  }
  parts.push("</dl></section>");
  return parts.join("\n");
}

const STYLE = `
body{margin:0;font:16px/1.5 system-ui,sans-serif;color:#1f1d1a;background:#f7f3ea}
main{max-width:60rem;margin:0 auto;padding:1.5rem}
h1{margin-bottom:.25rem}h2{margin-top:2.5rem;border-bottom:1px solid #1f1d1a}
a{color:#0b5d7a}code,pre{font:13px/1.45 ui-monospace,monospace}
pre{background:#fffdf7;border:1px solid #d8d0bf;padding:.75rem;overflow:auto;max-height:28rem}
.op{background:#fffdf7;border:1px solid #d8d0bf;border-radius:4px;padding:.5rem 1rem;margin:1rem 0}
.method{display:inline-block;min-width:4.5rem;text-align:center;border-radius:3px;color:#fff;background:#4a4a4a;font-size:.8rem;padding:.1rem .3rem}
.method.get{background:#0b5d7a}.method.post{background:#2f6b2f}.method.put{background:#7a5a0b}.method.delete{background:#8a2b2b}
.status{font-weight:600}.s2{color:#2f6b2f}.s4{color:#8a2b2b}.s5{color:#8a2b2b}
table{border-collapse:collapse;width:100%}th,td{border:1px solid #d8d0bf;padding:.25rem .5rem;text-align:left;vertical-align:top}
dt{float:left;clear:left;width:3.5rem}dd{margin:0 0 .5rem 3.5rem}.auth{color:#5a554c;font-size:.9rem}
`;

/** The whole page. */
export function openApiHtml(doc: OpenApiDocument): string {
  const operations: { method: string; path: string; op: Operation }[] = [];
  for (const [path, item] of Object.entries(doc.paths ?? {})) {
    for (const method of METHODS) {
      const op = (item as Record<string, Operation | undefined>)[method];
      if (op) operations.push({ method, path, op });
    }
  }
  const schemas = Object.entries(doc.components?.schemas ?? {}).sort(([a], [b]) => a.localeCompare(b));
  const title = escapeHtml(doc.info.title);
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${title} ${escapeHtml(doc.info.version)}: reference</title>
<style>${STYLE}</style>
</head>
<body>
<main>
<h1>${title}, version ${escapeHtml(doc.info.version)}</h1>
<p>${escapeHtml(doc.info.description ?? "")}</p>
<p>Machine-readable: <a href="/api/v1/openapi.json">/api/v1/openapi.json</a> (OpenAPI ${escapeHtml(doc.openapi)}).</p>
<nav aria-label="Operations"><h2>Operations</h2><ul>
${operations.map(({ method, path, op }) => `<li><a href="#op-${method}-${anchor(path)}"><code>${method.toUpperCase()} ${escapeHtml(path)}</code></a>${op.summary ? `: ${escapeHtml(op.summary)}` : ""}</li>`).join("\n")}
</ul></nav>
<h2>Endpoints</h2>
${operations.map(({ method, path, op }) => operationHtml(method, path, op)).join("\n")}
<h2>Schemas</h2>
${schemas.map(([name, schema]) => `<section id="${schemaId(name)}"><h3>${escapeHtml(name)}</h3>${schemaBlock(schema)}</section>`).join("\n")}
</main>
</body>
</html>
`;
}
