import { useQuery } from '@tanstack/react-query';
import { reviewQueries } from '../api/reviews';

/** The number of proposals waiting, next to "Review" in the navigation. */
export function ReviewCountBadge({ enabled }: { enabled: boolean }) {
  const count = useQuery({ ...reviewQueries.count(), enabled });
  if (!enabled || !count.data) return null;
  return (
    <span
      className="ml-1.5 inline-flex min-w-5 items-center justify-center rounded-full bg-copper px-1.5 text-xs leading-5 font-semibold text-white"
      data-testid="review-count"
    >
      {count.data}
      <span className="sr-only"> waiting for review</span>
    </span>
  );
}
