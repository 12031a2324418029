import { useQuery } from '@tanstack/react-query';
import { useParams } from 'react-router-dom';
import { PageHeader } from '@/components/ui/card';
import { RequireRole } from '@/components/layout/guards';
import { ReviewDetailView } from '@/features/review/components/review-detail';
import { ReviewQueue } from '@/features/review/components/review-queue';
import { reviewQueries } from '@/features/review/api/reviews';
import { renderWorkedExample } from '../worked-example';
import { EvidenceReview } from '@/features/runs/components/evidence';

export function ReviewQueuePage() {
  return (
    <RequireRole role="moderator">
      {() => (
        <>
          <PageHeader eyebrow="Moderators" title="Review queue">
            Proposals waiting for a decision, oldest first. Open one to see what it changes against the live version.
          </PageHeader>
          <ReviewQueue />
        </>
      )}
    </RequireRole>
  );
}

export function ReviewDetailPage() {
  const { revisionId = '' } = useParams();
  // The same query the detail view runs (shared cache): the live version's id, for the evidence comparison.
  const detail = useQuery({ ...reviewQueries.detail(revisionId), enabled: !!revisionId });
  return (
    <RequireRole role="moderator">
      {(user) => (
        <>
          <ReviewDetailView revisionId={revisionId} currentUserId={user.id} renderWorkedExample={renderWorkedExample} />
          {detail.data && <EvidenceReview revisionId={revisionId} liveRevisionId={detail.data.live?.id ?? null} />}
        </>
      )}
    </RequireRole>
  );
}
