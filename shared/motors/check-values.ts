import { meanAndSpread } from '../calc/control-limits';
import { measuredKv } from '../calc/measured-kv';
import { resistanceAt20C } from '../calc/winding-resistance';
import { BENCH_READINGS, type BenchReading, type ComparedQuantity } from './quantities';

/** What a check stores: the raw repeat readings per quantity and the temperature of the resistance reading. */
export type StoredReadings = { readings: Partial<Record<BenchReading, number[]>>; resistanceTempC: number | null };

/** Mean and spread of every reading, measured kV and the 20 °C resistance with their spreads. */
export type CheckValues = {
  readings: Partial<Record<BenchReading, { values: number[]; mean: number; spread: number }>>;
  measuredKv: number;
  measuredKvSpread: number;
  resistanceAt20COhm: number | null;
  resistanceAt20CSpread: number | null;
};

/**
 * Works out a check's values from its readings. kV's spread follows the readings' worst case
 * (relative spreads of speed and voltage add), the 20 °C resistance's scales with the reading's.
 */
export function checkValues(stored: StoredReadings): CheckValues {
  const readings: CheckValues['readings'] = {};
  for (const q of BENCH_READINGS) {
    const values = stored.readings[q];
    if (values?.length) readings[q] = { values, ...meanAndSpread(values) };
  }
  const rpm = readings.noLoadRpm!;
  const volts = readings.testVoltageV!;
  const kv = measuredKv(rpm.mean, volts.mean);
  const r = readings.phaseResistanceOhm;
  const t = stored.resistanceTempC;
  const r20 = r && t !== null ? resistanceAt20C(r.mean, t) : null;
  return {
    readings,
    measuredKv: kv,
    measuredKvSpread: kv * (rpm.spread / rpm.mean + volts.spread / volts.mean),
    resistanceAt20COhm: r20,
    resistanceAt20CSpread: r && r20 !== null ? (r.spread * r20) / r.mean : null,
  };
}

/** A compared quantity's value and spread in a check, or null when the check did not measure it. */
export function quantityOf(v: CheckValues, q: ComparedQuantity): { value: number; spread: number } | null {
  if (q === 'measuredKv') return { value: v.measuredKv, spread: v.measuredKvSpread };
  if (q === 'resistanceAt20COhm') return v.resistanceAt20COhm === null ? null : { value: v.resistanceAt20COhm, spread: v.resistanceAt20CSpread ?? 0 };
  const r = v.readings[q];
  return r ? { value: r.mean, spread: r.spread } : null;
}
