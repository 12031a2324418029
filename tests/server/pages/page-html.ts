import { expect } from 'vitest';

/** The page's JSON data block, parsed the way the browser's JSON.parse would. */
export function dataBlock(html: string) {
  const m = /<script type="application\/json" id="tw-initial-data">([\s\S]*?)<\/script>/.exec(html);
  expect(m, 'data block').not.toBeNull();
  return JSON.parse(m![1]);
}

/** The drawn app inside `#root`; React's markers between adjacent text pieces (`Version <!-- -->2`) are dropped to read it as text. */
export const rootOf = (html: string) => (/<div id="root">([\s\S]*?)<\/div><script type="application\/json"/.exec(html)?.[1] ?? '').replace(/<!-- -->/g, '');
