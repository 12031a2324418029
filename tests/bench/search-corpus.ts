import { CLASSES, SURFACES } from '../../shared/constants';
import { readParameterFiles } from '../../server/db/seed-content';
import { searchUrls } from '../../server/modules/search/documents';
import type { SearchDocument } from '../../server/modules/search/search-index';

/** A small deterministic PRNG (mulberry32), so every bench run sees the same corpus. */
export function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

// Invented places and the trade's own words; nothing here names a real track, club or maker.
const TRACKS = [
  'Harbour Flats Indoor',
  'Saltings Meadow',
  'the Tidewater car park',
  'Brackwater Barn',
  'Gullrock Hall',
  'Fenmarsh Raceway',
  'Cobble Quay',
  'Heronmere Park',
  'Lanternfield',
  'Shingle End',
  'Mudlark Arena',
  'Wrackline Common',
];
const LAYOUTS = [
  'tight layout',
  'flowing layout',
  'long straight',
  'technical infield',
  'big jumps',
  'sweeping layout',
  'short pass',
  'winter layout',
  'spring re-layout',
  'club night',
];
const WINDS = ['21.5T', '17.5T', '13.5T', '10.5T', '8.5T', '6.5T', '5.5T', '4.5T'];
const CELLS = ['1S', '2S', '3S', '4S', '6S'];
const EXTRA_TAGS = [
  'indoor',
  'outdoor',
  'blinky',
  'sensored',
  'sensorless',
  'motor heat',
  'dusty',
  'high grip',
  'low grip',
  'wet',
  'summer',
  'winter',
  'rollout',
  'timing',
  'launch',
  'jumps',
  'tyre wear',
  'club race',
  'beginner',
];
const CLASS_WORDS: Record<string, string> = {
  'buggy-2wd-stock': 'Stock 2WD buggy',
  'buggy-2wd-mod': 'Modified 2WD buggy',
  'buggy-4wd-mod': 'Modified 4WD buggy',
  'stadium-truck': 'Stadium truck',
  'short-course': 'Short-course truck',
  'touring-stock': 'Stock touring car',
  'touring-mod': 'Modified touring car',
  'buggy-8th-e': '1/8 electric buggy',
  oval: 'Oval pan car',
  drag: 'Drag car',
  crawler: 'Scale crawler',
};
const OPENERS = [
  'I started from the club baseline and changed one thing at a time.',
  'These numbers are a starting point for a first practice, not a rule.',
  'The surface changes a lot through the day, so check between rounds.',
  'Every change here was tried over at least three runs before it stayed.',
  'Write down what you change, and go back if the lap times do not improve.',
];
const MOVES = ['raise', 'lower', 'keep', 'add a little', 'take out some', 'start at', 'try'];
const EFFECTS = [
  'for a calmer corner entry',
  'so the car carries more speed',
  'to stop the rear stepping out',
  'for more bite on exit',
  'to keep the motor temperature down',
  'so the pack lasts the whole main',
  'for a smoother launch',
  'to help on the jumps',
  'because the grip came up late in the day',
  'to free the car in the hairpins',
];
const CHECKS = [
  'Check the motor temperature after five minutes; stop if it is too hot to hold.',
  'Charge on a fire-safe surface and never leave a charging lithium pack unattended.',
  'Keep fingers clear of the spur and pinion with the battery plugged in.',
  'Follow the maker’s instructions and the track and sanctioning body rules.',
  'Check the pinion mesh after every run on a dusty surface.',
  'Look at the tyres: worn tyres change the rollout.',
];

function pick<T>(r: () => number, xs: readonly T[]): T {
  return xs[Math.floor(r() * xs.length)];
}
function sample<T>(r: () => number, xs: readonly T[], n: number): T[] {
  const copy = [...xs];
  const out: T[] = [];
  while (out.length < n && copy.length) out.push(copy.splice(Math.floor(r() * copy.length), 1)[0]);
  return out;
}

/**
 * `n` synthetic guides written from the trade's vocabulary: class, surface, track, wind, cells,
 * 4–10 discussed parameters named by their names or aliases, values and reasons. Each body is
 * 250–450 words, like a member's short guide.
 */
export function syntheticGuides(n: number, seed = 20_240_601): SearchDocument[] {
  const r = rng(seed);
  const params = readParameterFiles();
  const out: SearchDocument[] = [];
  for (let i = 0; i < n; i++) {
    const cls = pick(r, CLASSES).slug;
    const surface = pick(r, SURFACES).slug;
    const track = pick(r, TRACKS);
    const wind = pick(r, WINDS);
    const cells = pick(r, CELLS);
    const discussed = sample(r, params, 4 + Math.floor(r() * 7));
    const title = `${CLASS_WORDS[cls]} on ${track} ${surface.replace('-', ' ')}, ${pick(r, LAYOUTS)}`;
    const sentences: string[] = [pick(r, OPENERS)];
    sentences.push(`This is a ${wind} ${cells} setup for ${SURFACES.find((s) => s.slug === surface)!.name.toLowerCase()} at ${track}.`);
    while (sentences.join(' ').split(' ').length < 250 + r() * 200) {
      const p = pick(r, discussed);
      const name = r() < 0.7 ? p.content.name.toLowerCase() : pick(r, p.content.aliases.length ? p.content.aliases : [p.content.name]);
      const { min, max, step } = p.content.range;
      const value = Math.round((min + r() * (max - min)) / step) * step;
      const unit = p.content.unit ? ` ${p.content.unit}` : '';
      sentences.push(`${pick(r, MOVES)} ${name} ${r() < 0.5 ? `to ${Number(value.toFixed(2))}${unit}` : ''} ${pick(r, EFFECTS)}.`.replace(/\s+/g, ' '));
      if (r() < 0.25) sentences.push(pick(r, CHECKS));
      if (r() < 0.15)
        sentences.push(
          `The ${pick(r, ['spur', 'pinion', 'final drive ratio', 'rollout'])} ended up at ${Math.round(20 + r() * 70)} after the ${pick(r, ['first', 'second', 'third'])} qualifier.`,
        );
    }
    const slug = `synthetic-${i}`;
    out.push({
      type: 'guide',
      slug,
      title,
      url: searchUrls.guide(slug),
      aliases: [],
      summary: `A ${wind} ${CLASS_WORDS[cls].toLowerCase()} baseline for ${track}, covering ${discussed
        .slice(0, 3)
        .map((p) => p.content.name.toLowerCase())
        .join(', ')}.`,
      body: sentences.map((s) => s[0].toUpperCase() + s.slice(1)).join(' '),
      tags: [wind, cells, ...sample(r, EXTRA_TAGS, 2 + Math.floor(r() * 3))],
      class: cls,
      surface,
      parameters: discussed.map((p) => p.slug),
    });
  }
  return out;
}
