import { parseWorkedExample } from '@shared/calc/worked-example';
import { exampleBlocks } from '@shared/content-checks/types';
import type { SetupStart } from '@/features/setups/components/setup-record-form';

/**
 * What a guide's new baseline starts from: the guide's class and surface as typed, and the gearing
 * of its first worked example that states one (spur, pinion, internal ratio, tyre), so the author
 * does not type the same numbers twice and the baseline agrees with the prose from the start.
 */
export function baselineStart(guide: { class: string; surface: string; body: string }): SetupStart {
  const start: SetupStart = { class: guide.class || undefined, surface: guide.surface || undefined };
  for (const block of exampleBlocks(guide.body)) {
    const parsed = parseWorkedExample(block.source);
    if (!parsed.ok) continue;
    const { spur, pinion, internalRatio, tyreDiameterMm } = parsed.inputs as Record<string, number | undefined>;
    if (spur === undefined || pinion === undefined) continue;
    start.gearing = {
      spurTeeth: spur,
      pinionTeeth: pinion,
      ...(internalRatio !== undefined ? { internalRatio } : {}),
      ...(tyreDiameterMm !== undefined ? { tyreDiameterMm } : {}),
    };
    break;
  }
  return start;
}
