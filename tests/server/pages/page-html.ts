import { expect } from 'vitest';
import { z } from 'zod';
import { initialDataSchema } from '../../../shared/schemas/initial-data';

/**
 * The page's JSON data block, parsed the way the browser's JSON.parse would, and held to the one contract
 * both sides type it with (shared/schemas/initial-data.ts, strict: no field the schema does not name).
 */
export function dataBlock(html: string) {
  const m = /<script type="application\/json" id="tw-initial-data">([\s\S]*?)<\/script>/.exec(html);
  expect(m, 'data block').not.toBeNull();
  const data = JSON.parse(m![1]); // untyped as before: each test reads the parts its page has
  const checked = initialDataSchema.safeParse(data);
  expect(checked.success, checked.success ? '' : z.prettifyError(checked.error)).toBe(true);
  return data;
}

/** The drawn app inside `#root`; React's markers between adjacent text pieces (`Version <!-- -->2`) are dropped to read it as text. */
export const rootOf = (html: string) => (/<div id="root">([\s\S]*?)<\/div><script type="application\/json"/.exec(html)?.[1] ?? '').replace(/<!-- -->/g, '');
