import type { SearchType } from '@shared/schemas/search';

const LABELS: Record<SearchType, string> = { parameter: 'Parameter', guide: 'Guide', setup: 'Setup' };
const TONES: Record<SearchType, string> = {
  parameter: 'border-copper/30 bg-copper-wash text-copper-dark',
  guide: 'border-ink/20 bg-paper-deep text-ink-soft',
  setup: 'border-ok-line bg-ok-wash text-ok',
};

export function TypeBadge({ type }: { type: SearchType }) {
  return (
    <span className={`inline-flex shrink-0 items-center rounded border px-1.5 py-px text-[0.7rem] font-semibold tracking-wide uppercase ${TONES[type]}`}>
      {LABELS[type]}
    </span>
  );
}
