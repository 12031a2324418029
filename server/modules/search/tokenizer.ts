/**
 * One tokenizer for the index and for queries, so a term is spelled the same on both sides.
 *
 * It keeps the trade's tokens whole: motor winds (`17.5T`, `13.5t`), cell counts (`2S`), voltages
 * (`3.2V`, also written `3.2 V`), scales (`1/10`), percentages and degrees. A number followed by a unit
 * word is joined into one token, so "3.2 V" and "3.2V" meet in the index.
 */

export type TokenSpan = { token: string; start: number; end: number };

// Words a unit can be (after a number, separated by nothing, one space or one hyphen).
const UNIT_WORDS = new Set([
  't',
  's',
  'v',
  'kv',
  'a',
  'mah',
  'mm',
  'cm',
  'in',
  'deg',
  'khz',
  'hz',
  'rpm',
  'c',
  'f',
  'pole',
  'poles',
  'wh',
  'ms',
  'w',
  'g',
  'wd',
  '%',
  '°',
  '°c',
  '°f',
]);

const RAW = /\d+\/\d+|\d+(?:[.,]\d+)*[a-z%°]*|°[cf]?|%|[\p{L}\p{N}]+(?:['’][\p{L}]+)?/gu;

const STOP_WORDS = new Set(
  (
    'a an the and or of to in on at for with without is are was be been being it its this that these those what which who whom how why when where ' +
    'does do did doing done i im my me mine you your we our us they their them can could should would will shall get gets got about from by as into ' +
    'than then so if not no yes very just more less much many there here up down out over under but also any some all each per vs use using used ' +
    'need want make makes mean means meaning'
  ).split(' '),
);

function normaliseNumber(raw: string) {
  // "12,000" is a thousands separator; "17,5T" is a decimal comma.
  const m = /^([\d.,]+)(.*)$/.exec(raw);
  if (!m) return raw;
  let num = m[1];
  if (/^\d{1,3}(,\d{3})+$/.test(num)) num = num.replace(/,/g, '');
  else num = num.replace(/,/g, '.');
  return num + m[2];
}

/** Splits text into lower-case tokens with their character ranges (for highlighting). */
export function tokenizeWithSpans(text: string): TokenSpan[] {
  const lower = text.toLowerCase();
  const out: TokenSpan[] = [];
  for (const m of lower.matchAll(RAW)) {
    let token = m[0];
    const start = m.index;
    const end = start + token.length;
    if (/^\d/.test(token) && !token.includes('/')) token = normaliseNumber(token);
    token = token.replace(/['’]s$/, '').replace(/['’]/g, '');
    const prev = out[out.length - 1];
    // Join "3.2 V", "4-pole", "18 °C" into one token when a bare number is followed by a unit word.
    if (prev && /^\d+(\.\d+)?$/.test(prev.token) && UNIT_WORDS.has(token) && start - prev.end <= 1 && /^[ -]?$/.test(lower.slice(prev.end, start))) {
      prev.token += token === 'poles' ? 'pole' : token;
      prev.end = end;
      continue;
    }
    out.push({ token, start, end });
  }
  return out;
}

/** Lower-case tokens of `text` (see tokenizeWithSpans). */
export function tokenize(text: string): string[] {
  return tokenizeWithSpans(text).map((t) => t.token);
}

/**
 * Normalises one token into an index term: drops stop words and folds simple plurals
 * ("brakes" → "brake", "batteries" → "battery"). Tokens holding digits are left exactly as typed.
 */
export function processTerm(token: string): string | null {
  if (!token) return null;
  if (/\d/.test(token)) return token;
  if (STOP_WORDS.has(token)) return null;
  if (token.length > 4 && token.endsWith('ies')) return token.slice(0, -3) + 'y';
  if (token.length > 3 && token.endsWith('s') && !/(ss|us|is)$/.test(token)) return token.slice(0, -1);
  return token;
}

/** Tokens of `text` as index terms (stop words removed, plurals folded). */
export function toTerms(text: string): string[] {
  const out: string[] = [];
  for (const t of tokenize(text)) {
    const p = processTerm(t);
    if (p) out.push(p);
  }
  return out;
}

/** True when a term is a trade token with digits (`17.5t`, `2s`, `1/10`): never fuzzy-matched. */
export function isNumericTerm(term: string) {
  return /\d/.test(term);
}
