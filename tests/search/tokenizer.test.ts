import { describe, expect, it } from 'vitest';
import { processTerm, scanTokens, tokenize, tokenizeWithSpans, toTerms } from '../../server/modules/search/tokenizer';
import { rng } from '../bench/search-corpus';
import { markdownToText } from '../../server/modules/search/markdown-text';
import { editDistance } from '../../server/modules/search/spelling';
import { snippetSegments } from '../../shared/schemas/search';

describe('search tokenizer', () => {
  it("keeps the trade's tokens whole", () => {
    expect(tokenize('17.5T buggy on 2S at 3.2V, 1/10 scale, 13.5t truck')).toEqual([
      '17.5t',
      'buggy',
      'on',
      '2s',
      'at',
      '3.2v',
      '1/10',
      'scale',
      '13.5t',
      'truck',
    ]);
  });

  it('joins a number and its unit written apart, so both spellings meet', () => {
    expect(tokenize('3.2 V per cell')).toEqual(['3.2v', 'per', 'cell']);
    expect(tokenize('3.2 V')).toEqual(tokenize('3.2V'));
    expect(tokenize('a 4-pole motor')).toEqual(['a', '4pole', 'motor']);
    expect(tokenize('10 % drag brake')).toEqual(['10%', 'drag', 'brake']);
  });

  it('reads thousands separators and decimal commas', () => {
    expect(tokenize('from 12,000 rpm')).toEqual(['from', '12000rpm']);
    expect(tokenize('17,5T')).toEqual(['17.5t']);
  });

  it('splits hyphenated words and drops punctuation, keeping character ranges', () => {
    expect(tokenize('Low-voltage cutoff (LVC)!')).toEqual(['low', 'voltage', 'cutoff', 'lvc']);
    const text = 'Set 3.2 V here';
    const spans = tokenizeWithSpans(text);
    expect(spans.map((s) => text.slice(s.start, s.end))).toEqual(['Set', '3.2 V', 'here']);
  });

  it('drops question words and folds plurals, but never changes tokens with digits', () => {
    expect(toTerms('What does drag brake do?')).toEqual(['drag', 'brake']);
    expect(processTerm('brakes')).toBe('brake');
    expect(processTerm('batteries')).toBe('battery');
    expect(processTerm('class')).toBe('class');
    expect(processTerm('2s')).toBe('2s');
    expect(processTerm('the')).toBeNull();
  });
});

describe('markdownToText', () => {
  it('keeps prose, link texts and table cells, and drops markup and worked-example numbers', () => {
    const md = [
      '## What it does',
      '',
      'Raise **drag brake** with [initial brake](initial-brake).',
      '',
      '| Class | Range |',
      '| --- | --- |',
      '| Stock | 5–10 % |',
      '',
      '```worked-example',
      'calc: brake',
      'dragBrakePct: 10',
      '```',
      '',
      'Text after the example counts too.',
    ].join('\n');
    const text = markdownToText(md);
    expect(text).toContain('What it does.');
    expect(text).toContain('Raise drag brake with initial brake.');
    expect(text).toContain('Stock · 5–10 %');
    expect(text).toContain('brake worked example');
    expect(text).toContain('Text after the example counts too.');
    expect(text).not.toMatch(/[#*[\]|]|dragBrakePct|initial-brake\)/);
  });
});

describe('scanTokens', () => {
  // The specification the hand-written scanner follows (see tokenizer.ts), run by the regex engine itself.
  const SPEC = /\d+\/\d+|\d+(?:[.,]\d+)*[a-z%°]*|°[cf]?|%|[\p{L}\p{N}]+(?:['’][\p{L}]+)?/gu;
  const bySpec = (lower: string) => [...lower.matchAll(SPEC)].map((m) => [m.index, m.index + m[0].length]);
  const byScanner = (lower: string) => {
    const out: number[][] = [];
    scanTokens(lower, (start, end) => out.push([start, end]));
    return out;
  };

  it('finds the same tokens as the regular expression it replaces, in any script', () => {
    for (const text of [
      '17.5t buggy on 2s at 3.2v, 1/10 scale; 12,000 rpm; 1/ 5 /8 3.2.1 4,5,6t 7.v',
      '18 °c or 64°f at 30%; °x % 5%%',
      "maker’s advice, don't; rock'n'roll ’quote’ it's1",
      'ærø straße ½ ² ٣ µs 中文 żółw ж日本 𝐀𝐁 😀x \ud800 a\udc00b',
      '',
      ' ',
      '...',
      "'s",
      '1',
      'a',
    ])
      expect(byScanner(text), text).toEqual(bySpec(text));
    // And on many random strings from an alphabet of the awkward cases.
    const alphabet = [..."ab s1 2.5,v-'’°%/cé 12,000 kv ies ss²½٣µßﬁ\u0301ωж中·", '𝐀', '😀', '\ud800', '\udc00', '1/', '.5', ',5'];
    const r = rng(42);
    for (let i = 0; i < 3000; i++) {
      let text = '';
      for (let k = 0, n = 1 + Math.floor(r() * 24); k < n; k++) text += alphabet[Math.floor(r() * alphabet.length)];
      expect(byScanner(text), JSON.stringify(text)).toEqual(bySpec(text));
    }
  });
});

describe('editDistance', () => {
  it('counts a swap of neighbours as one edit', () => {
    expect(editDistance('braek', 'brake')).toBe(1); // adjacent transposition
    expect(editDistance('dragbreak', 'dragbrake')).toBe(2); // 'eak' → 'ake' moves a letter two places: two edits
    expect(editDistance('kitten', 'sitting')).toBe(3); // the textbook Levenshtein example
    expect(editDistance('abc', 'abcdef', 1)).toBe(2); // early exit above the bound
  });
});

describe('snippetSegments', () => {
  it('splits a snippet into text and highlighted runs', () => {
    expect(snippetSegments('Raise <mark>drag</mark> <mark>brake</mark> a little')).toEqual([
      { text: 'Raise ', hit: false },
      { text: 'drag', hit: true },
      { text: ' ', hit: false },
      { text: 'brake', hit: true },
      { text: ' a little', hit: false },
    ]);
  });
});
