// Per-cell voltages by pack chemistry. A pack is cells × the per-cell value (cells in series).
// Sources, per value:
// - LiPo: full 4.20 V and nominal 3.7 V: Wikipedia, "Lithium polymer battery" (4.2 V full,
//   3.6–3.7 V nominal, 2.7–3.0 V discharged). Storage about 3.8 V: Battery University BU-303
//   "Confusion with Voltages" and its storage guidance (about 40–50 % charge). Cutoff window
//   3.0–3.4 V: common practice, no source (RC controllers' usual low-voltage cutoff settings).
// - LiHV: full 4.35 V, nominal 3.8 V: from memory. Storage 3.85 V, cutoff 3.0–3.4 V: common practice, no source.
// - LiFePO4: full 3.65 V and the 2.0 V discharged floor: the Faraday Institution's open BPX parameter
//   set for an LFP 18650 cell (2.0–3.65 V window). Nominal 3.3 V (3.2–3.3 V) and storage about 3.3 V:
//   common practice. Cutoff window 2.5–2.8 V: common practice, no source.
// - NiMH: nominal 1.2 V and the 1.0 V end point: Wikipedia, "Nickel–metal hydride battery". Full
//   about 1.45 V (peak charge 1.4–1.5 V): common practice. Cutoff window 0.9–1.0 V: the 1.0 V end
//   point, with 0.9 V as the lowest common setting (common practice). NiMH has no storage-voltage
//   target (makers give storage by state of charge and time, not a voltage), so storage is null.

/** The pack chemistries the pack calculator knows. */
export const packChemistries = ['lipo', 'lihv', 'lifepo4', 'nimh'] as const;

/** One of {@link packChemistries}. */
export type PackChemistry = (typeof packChemistries)[number];

/** Per-cell voltages for one chemistry. */
export type ChemistryVoltages = {
  label: string;
  fullV: number;
  nominalV: number;
  /** Storage voltage per cell, or null where the chemistry has no storage-voltage target. */
  storageV: number | null;
  /** Usual range for a low-voltage cutoff setting. */
  cutoffWindowV: { min: number; max: number };
  /** Voltage the sources call fully discharged; running below it damages the cell. */
  dischargedV: number;
  lithium: boolean;
};

/** Per-cell voltage table, by chemistry (see the sources at the top of this file). */
export const chemistryVoltages: Readonly<Record<PackChemistry, ChemistryVoltages>> = Object.freeze({
  lipo: {
    label: 'LiPo',
    fullV: 4.2,
    nominalV: 3.7,
    storageV: 3.8,
    cutoffWindowV: { min: 3.0, max: 3.4 },
    dischargedV: 2.7,
    lithium: true,
  },
  lihv: {
    label: 'LiHV',
    fullV: 4.35,
    nominalV: 3.8,
    storageV: 3.85,
    cutoffWindowV: { min: 3.0, max: 3.4 },
    dischargedV: 2.7, // from memory: the same floor as LiPo
    lithium: true,
  },
  lifepo4: {
    label: 'LiFePO4',
    fullV: 3.65,
    nominalV: 3.3,
    storageV: 3.3,
    cutoffWindowV: { min: 2.5, max: 2.8 },
    dischargedV: 2.0,
    lithium: true,
  },
  nimh: {
    label: 'NiMH',
    fullV: 1.45,
    nominalV: 1.2,
    storageV: null,
    cutoffWindowV: { min: 0.9, max: 1.0 },
    dischargedV: 0.9,
    lithium: false,
  },
});
