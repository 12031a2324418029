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

/*
 * Raw tokens, as the regular expression
 *   /\d+\/\d+|\d+(?:[.,]\d+)*[a-z%°]*|°[cf]?|%|[\p{L}\p{N}]+(?:['’][\p{L}]+)?/gu
 * would find them in lower-cased text: scales (1/10), numbers with their unit letters (17.5t, 3.2v),
 * degrees, percent, and words in any script (with one apostrophe part: "maker’s"). Scanned by hand
 * because a Unicode-property regular expression costs about ten times as much per word, and this
 * runs over every indexed text and every snippet; tests/search/tokenizer.test.ts holds the two equal.
 */
const LETTER = /^\p{L}$/u;
const LETTER_OR_NUMBER = /^[\p{L}\p{N}]$/u;
const nonAsciiClass = new Map<number, number>();

/** 1 for a letter, 2 for a number (any script), 0 otherwise; ASCII without a regular expression. */
function charClass(code: number): number {
  if (code < 128) return (code | 32) >= 97 && (code | 32) <= 122 ? 1 : code >= 48 && code <= 57 ? 2 : 0;
  let c = nonAsciiClass.get(code);
  if (c === undefined) {
    const ch = String.fromCodePoint(code);
    c = LETTER.test(ch) ? 1 : LETTER_OR_NUMBER.test(ch) ? 2 : 0;
    if (nonAsciiClass.size < 10_000) nonAsciiClass.set(code, c);
  }
  return c;
}

/** Length in UTF-16 units of a code point (a surrogate pair is read whole, as the `u` flag does). */
const unitsOf = (code: number) => (code > 0xffff ? 2 : 1);

/** Length of the run of letters (`withNumbers`: or numbers) starting at `i`. */
function wordRun(s: string, i: number, withNumbers: boolean): number {
  let j = i;
  while (j < s.length) {
    // No tuple per character: this runs over every character indexed.
    const code = s.codePointAt(j)!;
    const c = charClass(code);
    if (c === 1 || (withNumbers && c === 2)) j += unitsOf(code);
    else break;
  }
  return j - i;
}

const isUnitLetter = (code: number) => (code >= 97 && code <= 122) || code === 37 || code === 176; // a-z % °

/** Calls `emit(start, end, apostrophe)` for each raw token of `lower` (already lower-cased), in order. */
export function scanTokens(lower: string, emit: (start: number, end: number, apostrophe?: boolean) => void) {
  const n = lower.length;
  // charCodeAt past the end is NaN, which fails every test below, as the end of text should.
  let p = 0;
  while (p < n) {
    const code = lower.charCodeAt(p);
    if (isDigit(code)) {
      let q = p + 1;
      while (isDigit(lower.charCodeAt(q))) q++;
      if (lower.charCodeAt(q) === 47 && isDigit(lower.charCodeAt(q + 1))) {
        // 1/10
        q += 2;
        while (isDigit(lower.charCodeAt(q))) q++;
      } else {
        // 17.5t, 12,000, 3.2v, 30%
        while ((lower.charCodeAt(q) === 46 || lower.charCodeAt(q) === 44) && isDigit(lower.charCodeAt(q + 1))) {
          q += 2;
          while (isDigit(lower.charCodeAt(q))) q++;
        }
        while (isUnitLetter(lower.charCodeAt(q))) q++;
      }
      emit(p, q);
      p = q;
      continue;
    }
    if (code === 176) {
      // °, °c, °f
      const q = lower.charCodeAt(p + 1) === 99 || lower.charCodeAt(p + 1) === 102 ? p + 2 : p + 1;
      emit(p, q);
      p = q;
      continue;
    }
    if (code === 37) {
      emit(p, p + 1);
      p++;
      continue;
    }
    const word = wordRun(lower, p, true);
    if (word) {
      let q = p + word;
      const next = lower.charCodeAt(q);
      if (next === 39 || next === 0x2019) {
        const tail = wordRun(lower, q + 1, false);
        if (tail) {
          q += 1 + tail;
          emit(p, q, true);
          p = q;
          continue;
        }
      }
      emit(p, q);
      p = q;
      continue;
    }
    p += unitsOf(lower.codePointAt(p)!);
  }
}

const STOP_WORDS = new Set(
  (
    'a an the and or of to in on at for with without is are was be been being it its this that these those what which who whom how why when where ' +
    'does do did doing done i im my me mine you your we our us they their them can could should would will shall get gets got about from by as into ' +
    'than then so if not no yes very just more less much many there here up down out over under but also any some all each per vs use using used ' +
    'need want make makes mean means meaning'
  ).split(' '),
);

const isDigit = (code: number) => code >= 48 && code <= 57;

function hasDigit(s: string) {
  for (let i = 0; i < s.length; i++) if (isDigit(s.charCodeAt(i))) return true;
  return false;
}

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
  scanTokens(lower, (start, end, apostrophe) => {
    let token = lower.slice(start, end);
    // Plain checks before the regular expressions: this loop runs for every word indexed and every snippet.
    if (isDigit(token.charCodeAt(0)) && !token.includes('/')) token = normaliseNumber(token);
    if (apostrophe) token = token.replace(/['’]s$/, '').replace(/['’]/g, '');
    const prev = out[out.length - 1];
    // Join "3.2 V", "4-pole", "18 °C" into one token when a bare number is followed by a unit word.
    if (
      prev &&
      start - prev.end <= 1 &&
      isDigit(prev.token.charCodeAt(0)) &&
      UNIT_WORDS.has(token) &&
      /^\d+(\.\d+)?$/.test(prev.token) &&
      /^[ -]?$/.test(lower.slice(prev.end, start))
    ) {
      prev.token += token === 'poles' ? 'pole' : token;
      prev.end = end;
      return;
    }
    out.push({ token, start, end });
  });
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
  if (hasDigit(token)) return token;
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
  return hasDigit(term);
}
