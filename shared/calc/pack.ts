import type { z } from 'zod';
import { chemistryVoltages, packChemistries, type PackChemistry } from './chemistry';
import { choiceInput, inputObject, numberInput, optionalNumberInput } from './inputs';
import { roundSig } from './round';
import { defineCalculator, type CalcWarning } from './types';

/** Input of the pack calculator: chemistry, cells in series and an optional per-cell cutoff to check. */
export const packInput = inputObject({
  chemistry: choiceInput({
    label: 'Chemistry',
    options: packChemistries,
    optionLabels: { lipo: 'LiPo', lihv: 'LiHV', lifepo4: 'LiFePO4', nimh: 'NiMH' },
    aliases: { 'li-po': 'lipo', 'li-hv': 'lihv', lfp: 'lifepo4', life: 'lifepo4', 'ni-mh': 'nimh' },
    help: 'Cell chemistry of the drive pack.',
  }),
  cells: numberInput({ label: 'Cells', unit: 'S', min: 1, max: 12, int: true, help: 'Cells in series (2S = 2).' }),
  cutoffPerCellV: optionalNumberInput({
    label: 'Cutoff per cell',
    unit: 'V',
    min: 0.5,
    max: 4.5,
    step: 0.05,
    help: "The controller's low-voltage cutoff, per cell, to check against the usual window.",
  }),
});

/** Parsed pack input. */
export type PackInput = z.output<typeof packInput>;

type VoltageSet = {
  fullV: number;
  nominalV: number;
  /** Null for NiMH, which has no storage-voltage target. */
  storageV: number | null;
  cutoffWindowV: { min: number; max: number };
};

/** Pack results: pack voltages (cells × per-cell), the per-cell figures, and the cutoff check. */
export type PackResults = VoltageSet & {
  chemistry: PackChemistry;
  cells: number;
  cutoffV?: number;
  /** Where the chosen cutoff sits against the window. */
  cutoffCheck?: 'below-window' | 'in-window' | 'above-window';
  perCell: VoltageSet & { dischargedV: number };
};

const times = (cells: number, perCell: number) => roundSig(cells * perCell);
const volts = (value: number) => `${value.toFixed(2)} V`;

/** Computes full, nominal, storage and cutoff-window voltages for a pack and checks a chosen cutoff. */
export function computePack(input: PackInput) {
  const { chemistry, cells, cutoffPerCellV } = input;
  const cell = chemistryVoltages[chemistry];
  const warnings: CalcWarning[] = [];

  let cutoffCheck: PackResults['cutoffCheck'];
  if (cutoffPerCellV !== undefined) {
    if (cutoffPerCellV < cell.cutoffWindowV.min) {
      cutoffCheck = 'below-window';
      warnings.push({
        level: cell.lithium ? 'danger' : 'caution',
        code: 'cutoff-below-window',
        field: 'cutoffPerCellV',
        message: cell.lithium
          ? `${volts(cutoffPerCellV)} per cell is below the usual ${cell.label} cutoff window (${volts(cell.cutoffWindowV.min)}–${volts(cell.cutoffWindowV.max)}). ` +
            'Over-discharging a lithium cell damages it for good and can make it swell, overheat or catch fire on the next charge. ' +
            "Raise the cutoff and follow the pack maker's instructions."
          : `${volts(cutoffPerCellV)} per cell is below the usual NiMH end point: running cells this flat can reverse the weakest cell and ruin the pack. ` +
            "Raise the cutoff and follow the pack maker's instructions.",
      });
    } else if (cutoffPerCellV > cell.cutoffWindowV.max) {
      cutoffCheck = 'above-window';
      warnings.push({
        level: 'info',
        code: 'cutoff-above-window',
        field: 'cutoffPerCellV',
        message:
          `${volts(cutoffPerCellV)} per cell is above the usual ${cell.label} window (${volts(cell.cutoffWindowV.min)}–${volts(cell.cutoffWindowV.max)}): ` +
          'safe for the pack, but the controller cuts power early, so run time is shorter and the car may slow down or stop under hard acceleration.',
      });
    } else {
      cutoffCheck = 'in-window';
    }
    if (cutoffPerCellV >= cell.fullV) {
      warnings.push({
        level: 'caution',
        code: 'cutoff-above-full',
        field: 'cutoffPerCellV',
        message: `${volts(cutoffPerCellV)} per cell is at or above a full ${cell.label} cell (${volts(cell.fullV)}): the controller would cut out at once. Check the chemistry and the value.`,
      });
    }
  }

  if (cell.lithium) {
    warnings.push({
      level: 'info',
      code: 'lithium-care',
      message:
        `Charge ${cell.label} packs only with a charger set to this chemistry and cell count, never unattended, on a non-flammable surface or in a fire-resistant bag; ` +
        "stop using a swollen, punctured or hot pack. Follow the pack maker's instructions and the track's and sanctioning body's rules " +
        '(many cap LiPo at 4.20 V per cell at the start of a race and require hard-case packs).',
    });
  } else {
    warnings.push({
      level: 'info',
      code: 'nimh-care',
      message:
        "NiMH packs get hot on charge: use a charger with NiMH peak detection, do not leave it unattended, and follow the pack maker's instructions. " +
        'NiMH has no storage-voltage target, so no storage voltage is given.',
    });
  }
  if (chemistry === 'lihv') {
    warnings.push({
      level: 'info',
      code: 'lihv-race-rules',
      message: 'Race rules that cap lithium packs at 4.20 V per cell do not allow a LiHV pack charged to 4.35 V: check your class rules.',
    });
  }

  const perCell = {
    fullV: cell.fullV,
    nominalV: cell.nominalV,
    storageV: cell.storageV,
    cutoffWindowV: { ...cell.cutoffWindowV },
    dischargedV: cell.dischargedV,
  };
  const results: PackResults = {
    chemistry,
    cells,
    fullV: times(cells, cell.fullV),
    nominalV: times(cells, cell.nominalV),
    storageV: cell.storageV === null ? null : times(cells, cell.storageV),
    cutoffWindowV: { min: times(cells, cell.cutoffWindowV.min), max: times(cells, cell.cutoffWindowV.max) },
    ...(cutoffPerCellV !== undefined ? { cutoffV: times(cells, cutoffPerCellV), cutoffCheck } : {}),
    perCell,
  };
  return { results, warnings };
}

/** The pack calculator: pack voltages by chemistry and cell count, and a check of a chosen cutoff. */
export const packCalculator = defineCalculator({
  name: 'pack',
  title: 'Pack voltages and cutoff',
  description:
    'Full, nominal and storage voltage of a pack, the usual low-voltage cutoff window for its chemistry, and whether a chosen cutoff sits inside it.',
  input: packInput,
  defaults: { chemistry: 'lipo', cells: 2, cutoffPerCellV: 3.2 },
  compute: computePack,
});
