import { CLASSES, SURFACES } from '../../../shared/constants';
import { chemistryVoltages } from '../../../shared/calc/chemistry';
import { stripMarkup } from './markdown-text';

type Obj = Record<string, unknown>;

const CLASS_NAMES = new Map<string, string>(CLASSES.map((c) => [c.slug, c.name]));
const SURFACE_NAMES = new Map<string, string>(SURFACES.map((s) => [s.slug, s.name]));
/** Units as a racer writes them after a number. */
const UNIT_WORDS: Record<string, string> = { deg: '°', degC: '°C', pct: '%' };

const obj = (v: unknown): Obj => (v && typeof v === 'object' && !Array.isArray(v) ? (v as Obj) : {});
const num = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : undefined);
const str = (v: unknown) => (typeof v === 'string' && v.trim() ? v.trim() : undefined);
const withUnit = (value: number, unit: string) => {
  const u = UNIT_WORDS[unit] ?? unit;
  return u === '°' ? `${value}°` : u ? `${value} ${u}` : String(value);
};

/** A setting's value as words: `drag brake 8 %`; a choice (no unit) as its option number. */
function settingWords(slug: string, setting: unknown): string | undefined {
  const name = slug.replace(/-/g, ' ');
  const value = num(setting) ?? num(obj(setting).value);
  if (value === undefined) return undefined;
  const unit = str(obj(setting).unit) ?? '';
  // The cutoff is set per cell (see the setup record format); a racer would otherwise read it as the pack's.
  const perCell = slug === 'low-voltage-cutoff' && unit === 'V' ? ' per cell' : '';
  return unit ? `${name} ${withUnit(value, unit)}${perCell}` : `${name}: option ${value}`;
}

/** The ESC settings of a record, wherever an older or looser record keeps them. */
export function setupSettings(setup: Obj): Obj | undefined {
  const found = [setup.escSettings, setup.esc, setup.settings].find((v) => v && typeof v === 'object' && !Array.isArray(v));
  return found as Obj | undefined;
}

/**
 * A baseline setup record in words, for its search item: a headline such as
 * "17.5T sensored, 2S LiPo, 84/32 × 2.6, drag brake 8 %, …" (what a racer reads first in a
 * snippet) and the rest (notes, chassis, layout, conditions, other figures) as sentences. Every
 * text is stripped of markup; nothing is a bare run of raw values.
 */
export function setupText(setup: Obj): { headline: string; rest: string } {
  const motor = obj(setup.motor);
  const battery = obj(setup.battery);
  const gearing = obj(setup.gearing);
  const vehicle = obj(setup.vehicle);
  const conditions = obj(setup.conditions);
  const head: string[] = [];
  const wind = num(motor.windTurns);
  const kv = num(motor.kvRpmPerV);
  const sensing = typeof motor.sensored === 'boolean' ? (motor.sensored ? 'sensored' : 'sensorless') : '';
  const motorWords = [wind !== undefined ? `${wind}T` : kv !== undefined ? `${kv} kV` : '', sensing].filter(Boolean).join(' ');
  if (motorWords) head.push(motorWords);
  const cells = num(battery.cells);
  const chemistry = str(battery.chemistry);
  const chemistryName = chemistry ? (chemistryVoltages[chemistry as keyof typeof chemistryVoltages]?.label ?? chemistry) : '';
  const pack = [cells !== undefined ? `${cells}S` : '', chemistryName].filter(Boolean).join(' ');
  if (pack) head.push(pack);
  const spur = num(gearing.spurTeeth);
  const pinion = num(gearing.pinionTeeth);
  const internal = num(gearing.internalRatio);
  if (spur !== undefined && pinion !== undefined) head.push(internal !== undefined && internal !== 1 ? `${spur}/${pinion} × ${internal}` : `${spur}/${pinion}`);
  for (const [slug, setting] of Object.entries(setupSettings(setup) ?? {})) {
    const words = settingWords(slug, setting);
    if (words) head.push(words);
  }

  const rest: string[] = [];
  const add = (text: string | undefined) => {
    if (text) rest.push(stripMarkup(text).replace(/[.\s]+$/, ''));
  };
  add(str(setup.notes));
  const cls = str(vehicle.class) ?? str(setup.class);
  add(cls ? (CLASS_NAMES.get(cls) ?? cls) : undefined);
  add(str(vehicle.chassis));
  add(str(vehicle.name));
  add(str(vehicle.drivetrain)?.toUpperCase());
  if (wind !== undefined && kv !== undefined) add(`${kv} kV`);
  const poles = num(motor.poles);
  if (poles !== undefined) add(`${poles}-pole motor`);
  const endbell = num(motor.endbellTimingDeg);
  if (endbell !== undefined) add(`endbell timing ${endbell}°`);
  const tyre = num(gearing.tyreDiameterMm);
  if (tyre !== undefined) add(`${tyre} mm tyres`);
  const capacity = num(battery.capacityMah);
  if (capacity !== undefined) add(`${capacity} mAh pack`);
  const surface = str(conditions.surface) ?? str(setup.surface);
  add(surface ? (SURFACE_NAMES.get(surface) ?? surface) : undefined);
  add(str(conditions.layout));
  const ambient = num(conditions.ambientTempC);
  if (ambient !== undefined) add(`ambient ${ambient} °C`);
  const track = num(conditions.trackTempC);
  if (track !== undefined) add(`track ${track} °C`);
  return { headline: stripMarkup(head.join(', ')), rest: rest.filter(Boolean).join('. ') + (rest.length ? '.' : '') };
}
