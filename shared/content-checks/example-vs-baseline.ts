import { parseWorkedExample } from '../calc/worked-example';
import type { SetupRecord } from '../schemas/setup-record';
import { exampleBlocks, formatValue, type CheckSubject, type ContentCheck } from './types';

/** Where a calculator input lives in a baseline setup record, and what to call it. */
type Link = { path: string; label: string; read: (s: SetupRecord) => number | string | undefined };

const esc = (slug: string, label: string): Link => ({ path: `escSettings.${slug}`, label, read: (s) => s.escSettings[slug]?.value });
const gearing: Record<string, Link> = {
  spur: { path: 'gearing.spurTeeth', label: 'spur', read: (s) => s.gearing.spurTeeth },
  pinion: { path: 'gearing.pinionTeeth', label: 'pinion', read: (s) => s.gearing.pinionTeeth },
  internalRatio: { path: 'gearing.internalRatio', label: 'internal ratio', read: (s) => s.gearing.internalRatio },
  tyreDiameterMm: { path: 'gearing.tyreDiameterMm', label: 'tyre diameter', read: (s) => s.gearing.tyreDiameterMm },
};
const kv: Link = { path: 'motor.kvRpmPerV', label: 'kV', read: (s) => s.motor.kvRpmPerV };
const poles: Link = { path: 'motor.poles', label: 'pole count', read: (s) => s.motor.poles };

/** Calculator inputs that overlap a baseline, per calculator. */
const links: Record<string, Record<string, Link>> = {
  gearing,
  'top-speed': { ...gearing, kv },
  motor: { kv, poles },
  pack: {
    chemistry: { path: 'battery.chemistry', label: 'chemistry', read: (s) => s.battery.chemistry },
    cells: { path: 'battery.cells', label: 'cell count', read: (s) => s.battery.cells },
    cutoffPerCellV: esc('low-voltage-cutoff', 'low-voltage cutoff'),
  },
  throttle: { expoPct: esc('throttle-curve', 'throttle curve') },
  brake: {
    dragBrakePct: esc('drag-brake', 'drag brake'),
    initialBrakePct: esc('initial-brake', 'initial brake'),
    brakeStrengthPct: esc('brake-strength', 'brake strength'),
  },
  'timing-curve': {
    baseDeg: esc('static-timing', 'static timing'),
    rampDeg: esc('ramped-advance', 'ramped advance'),
    rampStartRpm: esc('ramp-start-rpm', 'ramp start'),
    rampEndRpm: esc('ramp-end-rpm', 'ramp end'),
    stepDeg: esc('full-throttle-advance', 'full-throttle advance'),
    stepDelayS: esc('full-throttle-delay', 'full-throttle delay'),
    endbellDeg: { path: 'motor.endbellTimingDeg', label: 'endbell timing', read: (s) => s.motor.endbellTimingDeg },
    poles,
  },
};

const show = (v: number | string) => (typeof v === 'number' ? formatValue(v) : v);

/**
 * Rule `example-matches-baseline`: a worked example's inputs agree with the guide's baseline where they
 * overlap. A different value is a warning (an example may show an alternative, and the text should say
 * so); a throttle curve bent the other way from the baseline's (positive expo is softer) is an error,
 * because the example then teaches the opposite of the setup it illustrates.
 */
export function exampleMatchesBaseline(subject: CheckSubject): ContentCheck[] {
  const setup = subject.setup;
  if (!setup) return [];
  const found: ContentCheck[] = [];
  for (const block of exampleBlocks(subject.body)) {
    const parsed = parseWorkedExample(block.source);
    if (!parsed.ok) continue;
    for (const [input, link] of Object.entries(links[parsed.calc] ?? {})) {
      if (!(input in parsed.rawInputs)) continue; // only what the author wrote, not a calculator default
      const mine = parsed.inputs[input];
      const theirs = link.read(setup);
      if (mine === undefined || mine === null || theirs === undefined || mine === theirs) continue;
      const path = `examples[${block.index}].${input}`;
      if (
        input === 'expoPct' &&
        typeof mine === 'number' &&
        typeof theirs === 'number' &&
        Math.sign(mine) !== Math.sign(theirs) &&
        mine !== 0 &&
        theirs !== 0
      ) {
        found.push({
          rule: 'example-matches-baseline',
          severity: 'error',
          path,
          message: `Worked example ${block.index + 1} bends the throttle curve the other way from the baseline (${formatValue(mine)} % against ${formatValue(theirs)} %). Positive expo softens the bottom end, negative sharpens it.`,
        });
        continue;
      }
      found.push({
        rule: 'example-matches-baseline',
        severity: 'warning',
        path,
        message: `Worked example ${block.index + 1} uses ${link.label} ${show(mine as number | string)} where the baseline has ${show(theirs)} (${link.path}). If the example shows an alternative, say so in the text.`,
      });
    }
  }
  return found;
}
