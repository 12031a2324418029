import { PageHeader } from '@/components/ui/card';
import { CompareView } from '@/features/setups/components/compare-view';

export function SetupsComparePage() {
  return (
    <>
      <PageHeader eyebrow="Setup library" title="Compare two setups">
        Every field side by side, what the change does to final drive ratio, rollout, top speed, timing and pack cutoff, and the cautions that go with it.
      </PageHeader>
      <CompareView />
    </>
  );
}
