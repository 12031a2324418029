import { describe, expect, it } from 'vitest';
import { normaliseNumberText } from '../../../shared/calc/inputs';
import { classRanges, classTypicalTexts } from '../../../shared/content-checks/class-ranges';
import { choiceLabel, settingChoices, typicalStart, type TypicalSetting } from '../../../shared/setup/choices';
import { readParameterFiles } from '../../../server/db/seed-content';

/** The library entry as the setup form receives it from GET /api/setups/esc-settings. */
function definition(slug: string) {
  const entry = readParameterFiles().find((p) => p.slug === slug)!;
  const ranges = classRanges({ slug, name: entry.content.name, unit: entry.content.unit, body: entry.content.body });
  const typical: Record<string, TypicalSetting> = {};
  for (const [cls, text] of classTypicalTexts(entry.content.body)) typical[cls] = { text, ...ranges.get(cls) };
  return { slug, typical };
}

describe('choice settings', () => {
  it('names every value of the library’s choice settings, in the order the entries count them', () => {
    // The entries' "What it does" sections: 0 = forward and brake, 1 = with reverse, 2 = no brake; zero-timing 0 = off, 1 = on.
    expect(choiceLabel('reverse-mode', 0)).toBe('Forward and brake');
    expect(choiceLabel('reverse-mode', 2)).toBe('Forward and reverse');
    expect(choiceLabel('zero-timing-mode', 1)).toBe('On');
    expect(choiceLabel('sensor-mode', 1)).toBe('Sensorless');
    expect(choiceLabel('reverse-mode', 3)).toBeNull();
    expect(choiceLabel('drag-brake', 0)).toBeNull();
    expect(settingChoices('drag-brake')).toBeNull();
  });

  it('has as many names as the entry’s range counts', () => {
    for (const p of readParameterFiles()) {
      const choices = settingChoices(p.slug);
      if (choices) expect(choices.length, p.slug).toBe(p.content.range.max - p.content.range.min + 1);
    }
  });
});

describe('typicalStart', () => {
  it('starts a choice at the one the class’s row names, and leaves it empty when the row names two', () => {
    expect(typicalStart(definition('reverse-mode'), 'buggy-2wd-stock')).toBe(0); // "Forward and brake"
    expect(typicalStart(definition('sensor-mode'), 'buggy-2wd-stock')).toBe(0); // "Sensored"
    expect(typicalStart(definition('sensor-mode'), 'short-course')).toBeUndefined(); // "Sensored or hybrid"
    expect(typicalStart(definition('zero-timing-mode'), 'touring-stock')).toBe(1); // "On, required"
    expect(typicalStart(definition('zero-timing-mode'), 'buggy-2wd-stock')).toBeUndefined(); // "Off or on"
  });

  it('never starts a number at the range minimum: a range of typical values leaves it empty', () => {
    expect(typicalStart(definition('drag-brake'), 'buggy-2wd-stock')).toBeUndefined(); // "0–10 %": the author chooses
    expect(typicalStart(definition('low-voltage-cutoff'), 'buggy-2wd-stock')).toBeUndefined(); // "3.2–3.4 V"
    expect(typicalStart(definition('drag-brake'), 'no-such-class')).toBeUndefined();
  });
});

describe('normaliseNumberText', () => {
  it('reads a decimal comma as a point and drops commas that group thousands', () => {
    expect(Number(normaliseNumberText('1,5'))).toBe(1.5);
    expect(Number(normaliseNumberText(' 3,25 '))).toBe(3.25);
    expect(Number(normaliseNumberText('0,125'))).toBe(0.125);
    expect(Number(normaliseNumberText('2,200'))).toBe(2200);
    expect(Number(normaliseNumberText('12,000.5'))).toBe(12000.5);
    expect(Number(normaliseNumberText('−4'))).toBe(-4);
    expect(normaliseNumberText('1,2,3')).toBe('1,2,3'); // not a number in either convention: left for the validator to refuse
  });
});
