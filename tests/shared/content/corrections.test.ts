import { describe, expect, it } from 'vitest';
import { readGuideDirs, readParameterHistory, readSetupFile } from '../../../server/db/seed-content';
import { finalDriveRatio, roadSpeedKmh } from '../../../shared/calc/gearing';
import { temperatureBands } from '../../../shared/calc/temperature';

/**
 * The statements an outside read of the library found wrong (issue #13). Each rule is run on what
 * readers and moderators see now (the live version and any proposal after it), where it must find
 * nothing, and on the version that held the wrong statement, where it must find it: the correction
 * is a new version, so the history still shows the old text.
 */
type Text = { body: string; setup: ReturnType<typeof readSetupFile> };

const guides = new Map(readGuideDirs().map((g) => [g.slug, g]));
const parameters = new Map(readParameterHistory().map((versions) => [versions[0].slug, versions]));

function guideVersion(slug: string, number: number): Text {
  const g = guides.get(slug)!;
  const r = g.revisions.find((x) => x.number === number)!;
  return { body: r.content.body, setup: readSetupFile(slug, number) };
}

/** The live version of a guide and every proposal after it. */
function guideCurrent(slug: string): Array<Text & { label: string }> {
  const g = guides.get(slug)!;
  const live = g.revisions.map((r) => r.state).lastIndexOf('published');
  return g.revisions.slice(Math.max(live, 0)).map((r) => ({ label: `${slug} v${r.number}`, body: r.content.body, setup: readSetupFile(slug, r.number) }));
}

function parameterBody(slug: string, number?: number) {
  const versions = parameters.get(slug)!;
  return (number === undefined ? versions[versions.length - 1] : versions.find((v) => v.number === number)!).content.body;
}

/** Motor temperatures the text calls fine, good, healthy or comfortable, or aims for, above the bands' hot line. */
function motorTemperaturesCalledFine(body: string): string[] {
  const hotFrom = temperatureBands.motor.hotFromC; // common practice: motors kept below about 71–82 °C after a run
  const found: string[] = [];
  const patterns = [/(?:under|below|around)\s+(\d+)\s*°C[^.;]*?\b(?:fine|good|healthy|comfortable)\b/gi, /(?:aim for|want) under (\d+)\s*°C/gi, /Anything around (\d+) °C[^.]*healthy/gi];
  for (const re of patterns) for (const m of body.matchAll(re)) if (Number(m[1]) > hotFrom) found.push(m[0]);
  return found;
}

/** Throttle worked examples whose expo sign disagrees with the baseline's throttle curve (positive is softer). */
function expoAgainstBaseline(t: Text): string[] {
  const baseline = t.setup?.escSettings['throttle-curve']?.value;
  if (baseline === undefined) return [];
  return [...t.body.matchAll(/calc: throttle\nexpoPct: (-?\d+)/g)].map((m) => Number(m[1])).filter((v) => Math.sign(v) !== Math.sign(baseline)).map(String);
}

/** Lithium charging cautions that leave out "never unattended" or balance charging (multi-cell packs). */
function chargingCautionGaps(t: Text): string[] {
  if (!t.setup || t.setup.battery.chemistry === 'nimh') return [];
  const paragraphs = t.body.split(/\n\s*\n/).filter((p) => /\bcharg(e|ed|ing)\b/i.test(p) && !/discharg/i.test(p.replace(/\bcharg(e|ed|ing)\b/gi, '')));
  if (paragraphs.length === 0) return [];
  const all = paragraphs.join('\n');
  const gaps: string[] = [];
  if (!/unattended/i.test(all)) gaps.push('never unattended');
  if (t.setup.battery.cells > 1 && !/balance/i.test(all)) gaps.push('balance charging');
  return gaps;
}

describe('content corrections (issue #13)', () => {
  it('thermal protection: overheating comes from gearing too tall, not too short', () => {
    const wrong = /trips thermal protection is geared too short/;
    expect(parameterBody('thermal-protection')).not.toMatch(wrong);
    expect(parameterBody('thermal-protection')).toMatch(/geared too tall \(too big a pinion, too low a \[final drive ratio\]/);
    expect(parameterBody('thermal-protection', 1)).toMatch(wrong);
    // The bands' source is named where the entry states them.
    expect(parameterBody('thermal-protection')).toMatch(/IEC 60085: class A 105 °C, E 120 °C, B 130 °C, F 155 °C, H 180 °C/);
  });

  it('throttle-curve examples use the baseline expo sign (positive is softer)', () => {
    for (const slug of ['short-course-saltings-meadow-loose-dirt', 'stadium-truck-harbour-flats-clay']) {
      for (const t of guideCurrent(slug)) expect(expoAgainstBaseline(t), t.label).toEqual([]);
    }
    expect(expoAgainstBaseline(guideVersion('short-course-saltings-meadow-loose-dirt', 1))).toEqual(['-30']);
    expect(expoAgainstBaseline(guideVersion('stadium-truck-harbour-flats-clay', 1))).toEqual(['-20']);
  });

  it('drag car: still pulling hard at the trap takes a smaller pinion', () => {
    const wrong = /still pulling hard at the trap\.\*\* Add a pinion tooth/;
    for (const t of guideCurrent('drag-car-park-asphalt')) {
      expect(t.body).not.toMatch(wrong);
      expect(t.body).toMatch(/still pulling hard at the trap\.\*\*[^\n]*take a pinion tooth off/);
    }
    expect(guideVersion('drag-car-park-asphalt', 1).body).toMatch(wrong);
  });

  it('stock 2WD buggy proposal: a drier, dustier track gets less drag brake, not more', () => {
    const [live, ...proposals] = guideCurrent('stock-2wd-buggy-harbour-flats-clay');
    const liveDrag = live.setup!.escSettings['drag-brake'].value;
    expect(proposals.length).toBeGreaterThan(0);
    for (const p of proposals) {
      expect(p.body).toMatch(/dust/);
      expect(p.setup!.escSettings['drag-brake'].value, p.label).toBeLessThan(liveDrag);
    }
    // The first draft of that proposal (once v3) raised it from 8 % to 12 %.
    expect(readGuideDirs().find((g) => g.slug === 'stock-2wd-buggy-harbour-flats-clay')!.revisions.at(-1)!.note).toMatch(/lowered from 8 % to 6 %/);
  });

  it('crawler: a clear neutral deadband with direct reverse and full drag brake', () => {
    const wrong = /deadband as narrow as the radio allows|Neutral deadband \| As narrow as the radio allows/;
    for (const t of guideCurrent('crawler-saltings-meadow-rock-garden')) {
      expect(t.body).not.toMatch(wrong);
      // common practice, as the neutral-deadband entry's class table has it: crawlers 2–6 %
      expect(t.setup!.escSettings['neutral-deadband'].value).toBeGreaterThanOrEqual(2);
    }
    expect(guideVersion('crawler-saltings-meadow-rock-garden', 1).body).toMatch(wrong);
    expect(guideVersion('crawler-saltings-meadow-rock-garden', 1).setup!.escSettings['neutral-deadband'].value).toBe(1);
  });

  it('no guide calls a motor temperature in the hot band fine', () => {
    for (const slug of guides.keys()) for (const t of guideCurrent(slug)) expect(motorTemperaturesCalledFine(t.body), t.label).toEqual([]);
    expect(motorTemperaturesCalledFine(guideVersion('stadium-truck-harbour-flats-clay', 1).body)).toEqual(['Under 75 °C after five minutes is fine']);
    expect(motorTemperaturesCalledFine(guideVersion('mod-4wd-buggy-harbour-flats-clay', 2).body)).toEqual(['aim for under 75 °C']);
    expect(motorTemperaturesCalledFine(guideVersion('mod-touring-car-park-asphalt', 3).body)).toEqual(['want under 80 °C']);
  });

  it('stadium-truck rollout and final-drive-ratio ranges agree on the same tyres', () => {
    const range = (body: string, re: RegExp) => {
      const m = body.match(re)!;
      return [Number(m[1]), Number(m[2])];
    };
    const tyreMm = 84; // the stadium guide's baseline tyre
    const check = (rolloutBody: string, fdrBody: string) => {
      const [rMin, rMax] = range(rolloutBody, /\| 1\/10 stadium truck \| (\d+)–(\d+) mm/);
      const [fMin, fMax] = range(fdrBody, /\| 1\/10 stadium truck \| ([\d.]+)–([\d.]+) \|/);
      // rollout = π × tyre diameter / final drive ratio (Wikipedia, "Gear train"; common practice)
      return Math.abs(rMin - (Math.PI * tyreMm) / fMax) < 1.5 && Math.abs(rMax - (Math.PI * tyreMm) / fMin) < 1.5;
    };
    expect(check(parameterBody('rollout'), parameterBody('final-drive-ratio'))).toBe(true);
    expect(check(parameterBody('rollout', 1), parameterBody('final-drive-ratio', 1))).toBe(false);
  });

  it('8,000 motor rpm on a stock buggy is about 12–16 km/h', () => {
    // Stock 2WD buggies run final drive ratios of about 6–7.8 on 62 mm tyres (the final-drive-ratio and
    // rollout entries); speed = rpm × π × tyre / ratio (Wikipedia, "Gear train"; common practice).
    const fast = roadSpeedKmh(8000, 62, finalDriveRatio(84, 35, 2.5)); // ratio 6.0
    const slow = roadSpeedKmh(8000, 62, finalDriveRatio(84, 28, 2.6)); // ratio 7.8
    const stated = (body: string) => body.match(/8,000 rpm is only about (\d+)–(\d+) km\/h/)!.slice(1).map(Number);
    const [lo, hi] = stated(parameterBody('ramp-start-rpm'));
    expect(Math.abs(lo - slow)).toBeLessThan(1);
    expect(Math.abs(hi - fast)).toBeLessThan(1);
    expect(stated(parameterBody('ramp-start-rpm', 1))).toEqual([15, 18]);
  });

  it('NiMH is not forgiving of deep discharge (cell reversal)', () => {
    expect(parameterBody('pack-chemistry')).not.toMatch(/voltage sag, forgiving of deep discharge/);
    expect(parameterBody('pack-chemistry')).toMatch(/Not forgiving of deep discharge[^.]*reverse/);
    expect(parameterBody('pack-chemistry', 1)).toMatch(/voltage sag, forgiving of deep discharge/);
  });

  it('every lithium charging caution says never unattended and, for multi-cell packs, balance charging', () => {
    for (const slug of guides.keys()) for (const t of guideCurrent(slug)) expect(chargingCautionGaps(t), t.label).toEqual([]);
    expect(chargingCautionGaps(guideVersion('mod-touring-car-park-asphalt', 3))).toEqual(['never unattended', 'balance charging']);
  });

  it('a 7.6 V figure for a 2S LiPo says where it comes from', () => {
    const unexplained = (body: string) => body.split(/\n\s*\n/).filter((p) => /7\.6 V/.test(p) && !/7\.4 V nominal/.test(p));
    for (const slug of guides.keys()) for (const t of guideCurrent(slug)) expect(unexplained(t.body), t.label).toEqual([]);
    expect(unexplained(guideVersion('stock-2wd-buggy-harbour-flats-clay', 2).body)).toHaveLength(1);
  });
});
