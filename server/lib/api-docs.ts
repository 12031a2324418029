// The API reference for people at /api/docs: the OpenAPI document rendered on the server as plain
// HTML tables. No script at all, so it sits inside the app's CSP (script-src 'self', no inline).

import escapeHtml from 'escape-html';
type Schema = {
  $ref?: string;
  type?: string | string[];
  properties?: Record<string, Schema>;
  required?: string[];
  items?: Schema;
  enum?: unknown[];
  const?: unknown;
  default?: unknown;
  anyOf?: Schema[];
  oneOf?: Schema[];
  allOf?: Schema[];
  format?: string;
  pattern?: string;
  minLength?: number;
  maxLength?: number;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  exclusiveMaximum?: number;
  minItems?: number;
  maxItems?: number;
  description?: string;
  additionalProperties?: boolean | Schema;
};
type Parameter = { in: string; name: string; required?: boolean; schema?: Schema; description?: string };
type Operation = {
  summary?: string;
  description?: string;
  tags?: string[];
  parameters?: Parameter[];
  requestBody?: { content?: Record<string, { schema?: Schema }> };
  responses?: Record<string, { description?: string; content?: Record<string, { schema?: Schema }> }>;
};
type OpenApiDoc = {
  info?: { title?: string; version?: string; description?: string };
  paths?: Record<string, Record<string, Operation>>;
  components?: { schemas?: Record<string, Schema> };
};

const METHODS = ['get', 'post', 'put', 'patch', 'delete'] as const;

const esc = (s: unknown) => escapeHtml(String(s));

function resolve(doc: OpenApiDoc, s: Schema | undefined, seen = 0): Schema | undefined {
  if (!s?.$ref || seen > 10) return s;
  const name = s.$ref.replace('#/components/schemas/', '');
  return resolve(doc, doc.components?.schemas?.[name], seen + 1);
}

function typeOf(doc: OpenApiDoc, raw: Schema | undefined): string {
  const s = resolve(doc, raw);
  if (!s) return 'any';
  if (s.const !== undefined) return JSON.stringify(s.const);
  if (s.enum) return s.enum.map((v) => JSON.stringify(v)).join(' | ');
  const alt = s.anyOf ?? s.oneOf;
  if (alt) return alt.map((a) => typeOf(doc, a)).join(' | ');
  if (s.allOf) return s.allOf.map((a) => typeOf(doc, a)).join(' & ');
  const type = Array.isArray(s.type) ? s.type.join(' | ') : s.type;
  if (type === 'array') return `array of ${typeOf(doc, s.items)}`;
  if (type === 'string' && s.format) return `string (${s.format})`;
  return type ?? 'any';
}

function rules(s: Schema | undefined): string {
  if (!s) return '';
  const out: string[] = [];
  if (s.minLength !== undefined && s.maxLength !== undefined) out.push(`${s.minLength}–${s.maxLength} characters`);
  else if (s.minLength !== undefined) out.push(`at least ${s.minLength} characters`);
  else if (s.maxLength !== undefined) out.push(`at most ${s.maxLength} characters`);
  if (s.minimum !== undefined) out.push(`≥ ${s.minimum}`);
  if (s.exclusiveMinimum !== undefined) out.push(`> ${s.exclusiveMinimum}`);
  if (s.maximum !== undefined) out.push(`≤ ${s.maximum}`);
  if (s.exclusiveMaximum !== undefined) out.push(`< ${s.exclusiveMaximum}`);
  if (s.minItems !== undefined) out.push(`at least ${s.minItems} items`);
  if (s.maxItems !== undefined) out.push(`at most ${s.maxItems} items`);
  if (s.pattern && s.format !== 'uuid') out.push(`matches <code>${esc(s.pattern)}</code>`);
  if (s.default !== undefined) out.push(`default <code>${esc(JSON.stringify(s.default))}</code>`);
  if (s.description) out.push(esc(s.description));
  return out.join('; ');
}

/** Rows for an object schema's fields, nested objects indented, down to a few levels. */
function fieldRows(doc: OpenApiDoc, raw: Schema | undefined, prefix = '', depth = 0): string[] {
  const s = resolve(doc, raw);
  if (!s || depth > 3) return [];
  const target = s.type === 'array' ? resolve(doc, s.items) : s;
  if (!target?.properties) return [];
  const required = new Set(target.required ?? []);
  const rows: string[] = [];
  for (const [name, inner] of Object.entries(target.properties)) {
    const field = resolve(doc, inner);
    rows.push(
      `<tr><td><code>${esc(prefix + name)}</code></td><td>${esc(typeOf(doc, field))}</td><td>${required.has(name) ? 'yes' : 'no'}</td><td>${rules(field)}</td></tr>`,
    );
    rows.push(...fieldRows(doc, field, `${prefix}${name}${field?.type === 'array' ? '[]' : ''}.`, depth + 1));
  }
  return rows;
}

function fieldTable(doc: OpenApiDoc, caption: string, schema: Schema | undefined) {
  const rows = fieldRows(doc, schema);
  if (!rows.length) return schema ? `<p class="muted">${esc(caption)}: ${esc(typeOf(doc, schema))}</p>` : '';
  return `<table><caption>${esc(caption)}</caption><thead><tr><th scope="col">Field</th><th scope="col">Type</th><th scope="col">Required</th><th scope="col">Rules</th></tr></thead><tbody>${rows.join('')}</tbody></table>`;
}

const anchor = (method: string, path: string) => `${method}-${path}`.replace(/[^A-Za-z0-9]+/g, '-').replace(/-+$/, '');

function operationHtml(doc: OpenApiDoc, method: string, path: string, op: Operation) {
  const access = /Access: ([a-z]+)/.exec(op.description ?? '')?.[1] ?? 'public';
  const params = op.parameters ?? [];
  const paramTable = params.length
    ? `<table><caption>Parameters</caption><thead><tr><th scope="col">Name</th><th scope="col">In</th><th scope="col">Type</th><th scope="col">Required</th><th scope="col">Rules</th></tr></thead><tbody>${params
        .map(
          (p) =>
            `<tr><td><code>${esc(p.name)}</code></td><td>${esc(p.in)}</td><td>${esc(typeOf(doc, p.schema))}</td><td>${p.required ? 'yes' : 'no'}</td><td>${rules(resolve(doc, p.schema))}</td></tr>`,
        )
        .join('')}</tbody></table>`
    : '';
  const bodyTypes = Object.entries(op.requestBody?.content ?? {});
  const body = bodyTypes.map(([type, c]) => fieldTable(doc, `Request body (${type})`, c.schema)).join('');
  const success = Object.entries(op.responses ?? {}).find(([code]) => code.startsWith('2'));
  let response = '';
  if (success) {
    const [code, r] = success;
    const dataSchema = resolve(doc, r.content?.['application/json']?.schema)?.properties?.data;
    response = dataSchema ? fieldTable(doc, `Success ${code}: data`, dataSchema) : `<p class="muted">Success ${esc(code)}: ${esc(r.description ?? '')}</p>`;
  }
  return `<section class="op" id="${anchor(method, path)}" aria-labelledby="${anchor(method, path)}-h">
<h3 id="${anchor(method, path)}-h"><span class="method ${method}">${method.toUpperCase()}</span> <code>${esc(path)}</code></h3>
<p>${esc(op.summary ?? '')}</p>
<p class="meta"><span class="access ${esc(access)}">${esc(access === 'public' ? 'anyone' : `${access} or above`)}</span>${method !== 'get' ? ' · send the <code>x-csrf-token</code> header' : ''}</p>
${paramTable}${body}${response}
</section>`;
}

const STYLE = `
body{font:16px/1.5 system-ui,sans-serif;color:#1d1b18;background:#faf7f2;margin:0}
main{max-width:72rem;margin:0 auto;padding:1.5rem}
h1{margin:.2rem 0}h2{margin-top:2.5rem;border-bottom:2px solid #b5652b;padding-bottom:.2rem;text-transform:capitalize}
code{font-family:ui-monospace,monospace;font-size:.92em}
nav ul{columns:2 22rem;padding-left:1rem}nav li{break-inside:avoid}
.op{background:#fff;border:1px solid #ddd5c8;border-radius:.5rem;padding:.5rem 1rem 1rem;margin:1rem 0}
.method{display:inline-block;min-width:4.2rem;text-align:center;border-radius:.3rem;padding:0 .4rem;color:#fff;font-size:.85rem}
.get{background:#2f5f8a}.post{background:#2e7d4f}.patch,.put{background:#8a5a12}.delete{background:#9b2c2c}
.meta{font-size:.9rem;color:#4a453e}.access{font-weight:600}
.muted{color:#4a453e}
table{border-collapse:collapse;width:100%;margin:.6rem 0;font-size:.92rem}
caption{text-align:left;font-weight:600;padding:.2rem 0}
th,td{border:1px solid #ddd5c8;padding:.3rem .5rem;text-align:left;vertical-align:top}
th{background:#f1ebe1}
@media (max-width:40rem){main{padding:.75rem}td,th{padding:.2rem .3rem}}
`;

/** The whole reference page for an OpenAPI document (as built by buildOpenApi). */
export function renderApiDocs(openapi: unknown): string {
  const doc = openapi as OpenApiDoc;
  const groups = new Map<string, Array<{ method: string; path: string; op: Operation }>>();
  for (const [path, item] of Object.entries(doc.paths ?? {})) {
    for (const method of METHODS) {
      const op = item[method];
      if (!op) continue;
      const tag = op.tags?.[0] ?? 'other';
      if (!groups.has(tag)) groups.set(tag, []);
      groups.get(tag)!.push({ method, path, op });
    }
  }
  const toc = [...groups]
    .map(
      ([tag, ops]) =>
        `<li><a href="#tag-${esc(tag)}">${esc(tag)}</a><ul>${ops.map((o) => `<li><a href="#${anchor(o.method, o.path)}">${o.method.toUpperCase()} ${esc(o.path)}</a></li>`).join('')}</ul></li>`,
    )
    .join('');
  const sections = [...groups]
    .map(([tag, ops]) => `<h2 id="tag-${esc(tag)}">${esc(tag)}</h2>${ops.map((o) => operationHtml(doc, o.method, o.path, o.op)).join('')}`)
    .join('');
  const title = `${doc.info?.title ?? 'API'} ${doc.info?.version ?? ''}`.trim();
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${esc(title)} reference</title><style>${STYLE}</style></head>
<body><main>
<h1>${esc(title)}</h1>
<p>Every route of the API, generated from the same route table that validates requests. The machine-readable document is at <a href="/api/openapi.json"><code>/api/openapi.json</code></a>.</p>
<ul>
<li>Successes answer <code>{ "data": … }</code>; lists add <code>"meta"</code>. Failures answer <code>{ "error": { "code", "message", "details"? } }</code> with a real HTTP status; validation failures list each field in <code>details</code> as <code>{ path, message }</code>.</li>
<li>Sign in with <code>POST /api/auth/sign-in</code>; the session lives in an HttpOnly cookie. Every call that changes something needs the <code>x-csrf-token</code> header, with the token from <code>GET /api/csrf</code>.</li>
<li>Common refusals: 400 validation, 401 sign in first, 403 not allowed or CSRF token missing, 404, 409 conflict, 413 too large, 415 wrong content type, 429 rate limited, 503 database unavailable (retry after a few seconds).</li>
</ul>
<nav aria-label="Routes"><h2>Contents</h2><ul>${toc}</ul></nav>
${sections}
</main></body></html>`;
}
