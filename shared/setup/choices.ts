import type { SettingDefinitionRow } from '../schemas/setup';

/**
 * What each value of a choice setting means, in the order the parameter library counts them
 * (each entry's "What it does" section). A choice is stored as its number in a setup record, but
 * people only ever see and pick it by name.
 */
export const SETTING_CHOICES: Readonly<Record<string, readonly string[]>> = {
  'zero-timing-mode': ['Off', 'On'],
  'sensor-mode': ['Sensored', 'Sensorless', 'Hybrid'],
  'reverse-mode': ['Forward and brake', 'Forward, brake and reverse', 'Forward and reverse'],
  'motor-rotation': ['Normal', 'Reversed'],
};

/** The named choices of a setting, or null when it is a number. */
export function settingChoices(slug: string): readonly string[] | null {
  return SETTING_CHOICES[slug] ?? null;
}

/** A choice setting's value by its name ("On"), or null when the value is not one of its choices. */
export function choiceLabel(slug: string, value: number): string | null {
  const choices = SETTING_CHOICES[slug];
  return choices && Number.isInteger(value) ? (choices[value] ?? null) : null;
}

/** A class's typical value of a setting, as the entry's "Typical settings by class" table states it. */
export type TypicalSetting = { text: string; min?: number; max?: number };

/**
 * The value an added setting starts at for a class: the library's typical value when the class's
 * row names one value (a number, or a choice by its name), otherwise nothing — the author types it.
 * Never the range minimum: a minimum is a limit, not a recommendation.
 */
export function typicalStart(def: Pick<SettingDefinitionRow, 'slug'> & { typical?: Record<string, TypicalSetting> }, classSlug: string): number | undefined {
  const typical = def.typical?.[classSlug];
  if (!typical) return undefined;
  const choices = SETTING_CHOICES[def.slug];
  if (choices) {
    // The cell names the choice ("Forward and brake", "On, required"); "Off or on" names none.
    const text = typical.text.toLowerCase();
    const named = choices
      .map((label, value) => ({ label: label.toLowerCase(), value }))
      .filter(({ label }) => new RegExp(`^${label.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}\\b`).test(text));
    if (named.length !== 1 || /\bor\b/.test(text)) return undefined;
    return named[0].value;
  }
  return typical.min !== undefined && typical.min === typical.max ? typical.min : undefined;
}
