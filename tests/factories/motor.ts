import { expect } from 'vitest';
import type { TestClient } from '../setup/test-app';

/** Registers a motor through the API for the signed-in client. */
export async function createMotor(client: TestClient, overrides: Record<string, unknown> = {}) {
  const res = await client.post('/api/motors', {
    label: 'Club stock 17.5 (blue can)',
    kvRpmPerV: 2300,
    windTurns: 17.5,
    poles: 2,
    sensored: true,
    ...overrides,
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data as { id: string; label: string };
}

/** A plausible bench check of a 17.5-turn motor on a 7.4 V supply (invented numbers). */
export function buildCheck(overrides: Record<string, unknown> = {}) {
  return {
    testedAt: '2026-11-02T19:30:00Z',
    testVoltageV: 7.4,
    noLoadRpm: 17_020,
    noLoadCurrentA: 2.1,
    timingDeg: 30,
    rotorSymmetryPct: 0.6,
    sensorDeviationPct: 1.2,
    phaseResistanceOhm: 0.0215,
    resistanceTempC: 22,
    ...overrides,
  };
}

/** Adds a check through the API and returns it. */
export async function addCheck(client: TestClient, motorId: string, overrides: Record<string, unknown> = {}) {
  const res = await client.post(`/api/motors/${motorId}/checks`, buildCheck(overrides));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.data as { id: string; computed: { measuredKv: number } };
}
