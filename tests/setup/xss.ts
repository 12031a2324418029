import type { Page } from 'playwright-core';

/**
 * Hostile markup and Markdown, each piece trying to set window.__xss or open a dialog. Guide bodies
 * get it as Markdown; every other text field gets it as plain text, where it must show as written.
 */
export const XSS_CORPUS = [
  '<script>window.__xss = "script"</script>',
  '<img src="x" onerror="window.__xss = \'img-onerror\'">',
  '<svg onload="window.__xss = \'svg-onload\'"><circle r="5"/></svg>',
  '<svg><script>window.__xss = "svg-script"</script></svg>',
  '<iframe src="javascript:window.top.__xss = \'iframe-js\'"></iframe>',
  '<iframe srcdoc="<script>parent.__xss = \'srcdoc\'</script>"></iframe>',
  '<style>@import "javascript:alert(1)"; body { background: url("javascript:window.__xss=1") }</style>',
  '<div style="background:url(javascript:alert(\'style\'))" onmouseover="alert(\'hover\')">hover me</div>',
  '<details open ontoggle="alert(\'details\')"><summary>x</summary></details>',
  '<input autofocus onfocus="alert(\'focus\')">',
  '<object data="javascript:alert(\'object\')"></object><embed src="javascript:alert(\'embed\')">',
  '<a href="javascript:alert(\'raw-a\')">raw link</a>',
  '<math><mi xlink:href="javascript:alert(\'math\')">m</mi></math>',
  '<meta http-equiv="refresh" content="0;url=javascript:alert(\'meta\')">',
  '<form action="javascript:alert(\'form\')"><button>go</button></form>',
  '[md javascript link](javascript:alert("md-js"))',
  '[md mixed case](JaVaScRiPt:alert("md-case"))',
  '[md entity](jav&#x09;ascript:alert("md-entity"))',
  '[md data link](data:text/html;base64,PHNjcmlwdD5hbGVydCgxKTwvc2NyaXB0Pg==)',
  '[md vbscript](vbscript:msgbox("x"))',
  '![md image js](javascript:alert("img-js"))',
  '![md image data](data:image/svg+xml;base64,PHN2ZyBvbmxvYWQ9YWxlcnQoMSk+PC9zdmc+)',
  '![broken](x" onerror="alert(\'attr-break\'))',
  '<javascript:alert("autolink")>',
  '[reference link][evil]\n\n[evil]: javascript:alert("ref")',
  '```worked-example\ncalc: <script>window.__xss = "example"</script>\nspur: <img src=x onerror=alert(1)>\n```',
  '<scr<script>ipt>window.__xss = "nested"</script>',
];

/** Extra pieces aimed at plain-text fields: breaking out of attributes, titles, encodings, templates. */
export const XSS_TEXT_EXTRAS = [
  '"><script>window.__xss="attr-dq"</script>',
  "'><img src=x onerror=alert('attr-sq')>",
  '</title><script>alert("title")</script>',
  '</textarea><img src=x onerror=alert("ta")>',
  'javascript:alert("bare-js")',
  '%3Cscript%3Ealert("pct")%3C%2Fscript%3E',
  '&lt;img src=x onerror=alert("ent")&gt;',
  "{{constructor.constructor('alert(1)')()}}",
  '<img src=x onerror=alert`tick`>',
  '<body onload=alert("body")>',
];

/** The corpus for one-line text fields: line breaks become spaces (titles, names and tags are one line). */
export const XSS_TEXT_CORPUS = [...XSS_CORPUS, ...XSS_TEXT_EXTRAS].map((p) => p.replace(/\s*\n+\s*/g, ' '));

/**
 * Packs pieces greedily into strings of at most `max` characters (joined by a space), so a field with a
 * length limit carries as much of the corpus as it can; pieces longer than `max` alone are left out.
 */
export function packCorpus(pieces: string[], max: number, prefixLength = 0): string[] {
  const room = max - prefixLength;
  const packs: string[] = [];
  let current = '';
  for (const p of pieces.filter((x) => x.length <= room)) {
    if (!current) current = p;
    else if (current.length + 1 + p.length <= room) current += ` ${p}`;
    else {
      packs.push(current);
      current = p;
    }
  }
  if (current) packs.push(current);
  return packs;
}

/** Records every dialog (alert/confirm/prompt) the page opens, dismissing it. */
export function collectDialogs(page: Page): string[] {
  const dialogs: string[] = [];
  page.on('dialog', (d) => {
    dialogs.push(d.message());
    void d.dismiss();
  });
  return dialogs;
}

/** Value of window.__xss, which every corpus script tries to set. */
export function readXssFlag(page: Page): Promise<string | null> {
  return page.evaluate(() => (window as unknown as { __xss?: string }).__xss ?? null);
}

/**
 * Scans rendered user content for what the sanitizer must never let through. Strict: for a root that holds
 * only user content (a guide body), where even inputs, forms and inline styles are foreign.
 */
export function strictDomScan(root: Element): string[] {
  const bad: string[] = [];
  for (const el of Array.from(root.querySelectorAll('*'))) {
    const tag = el.tagName.toLowerCase();
    if (['script', 'iframe', 'object', 'embed', 'style', 'form', 'input', 'meta', 'link', 'base'].includes(tag)) bad.push(`<${tag}>`);
    for (const attr of Array.from(el.attributes)) {
      if (/^on/i.test(attr.name)) bad.push(`${tag}[${attr.name}]`);
      if (attr.name === 'style') bad.push(`${tag}[style]`);
      if (['href', 'src', 'xlink:href', 'action', 'data', 'srcdoc'].includes(attr.name) && !/^(https?:|\/|#|[a-z0-9._-]+(\/|$))/i.test(attr.value.trim()))
        bad.push(`${tag}[${attr.name}=${attr.value.slice(0, 40)}]`);
    }
  }
  return bad;
}

/**
 * Scans a whole page (the app's own chrome included, so its inputs, forms and styles are allowed) for
 * markup that only an injected piece would add: script-carrying elements in the body, event-handler
 * attributes, and script/data URLs.
 */
export function pageDomScan(root: Element): string[] {
  const bad: string[] = [];
  // The page's own data block (a server-drawn page's reads, JSON that never runs): the first one only.
  const dataBlock = root.querySelector('script#tw-initial-data[type="application/json"]');
  for (const el of Array.from(root.querySelectorAll('*'))) {
    const tag = el.tagName.toLowerCase();
    if (el === dataBlock && el.attributes.length === 2) continue;
    if (['script', 'iframe', 'frame', 'object', 'embed', 'meta', 'link', 'base', 'style'].includes(tag)) bad.push(`<${tag}>`);
    for (const attr of Array.from(el.attributes)) {
      if (/^on/i.test(attr.name)) bad.push(`${tag}[${attr.name}]`);
      if (attr.name === 'srcdoc') bad.push(`${tag}[srcdoc]`);
      // Browsers drop spaces and control characters inside a URL's scheme, so compare without them.
      if (
        ['href', 'src', 'xlink:href', 'action', 'formaction', 'data', 'poster'].includes(attr.name) &&
        /^(javascript|data|vbscript):/i.test(
          Array.from(attr.value)
            .filter((c) => c.charCodeAt(0) > 0x20)
            .join(''),
        )
      )
        bad.push(`${tag}[${attr.name}=${attr.value.slice(0, 40)}]`);
      if (attr.name === 'style' && /javascript:|expression\(/i.test(attr.value)) bad.push(`${tag}[style=${attr.value.slice(0, 40)}]`);
    }
  }
  return bad;
}
