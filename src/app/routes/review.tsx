import { useQuery } from '@tanstack/react-query';
import { Link, useParams } from 'react-router-dom';
import { PAGE_PATTERNS } from '@shared/paths';
import { PageHeader } from '@/components/ui/card';
import { RequireRole } from '@/components/layout/guards';
import { ReviewDetailView } from '@/features/review/components/review-detail';
import { ReviewQueue } from '@/features/review/components/review-queue';
import { reviewQueries } from '@/features/review/api/reviews';
import { renderWorkedExample } from '../worked-example';
import { EvidenceReview } from '@/features/runs/components/evidence';
import { HiddenList } from '@/features/audit/components/hidden-list';

export function ReviewQueuePage() {
  return (
    <RequireRole role="moderator">
      {() => (
        <>
          <PageHeader eyebrow="Moderators" title="Review queue" actions={<Link to={PAGE_PATTERNS.audit}>Audit log</Link>}>
            Proposals waiting for a decision, oldest first. Open one to see what it changes against the live version.
          </PageHeader>
          <ReviewQueue />
          <section aria-labelledby="hidden-heading" className="mt-10 flex flex-col gap-3">
            <h2 id="hidden-heading" className="text-lg font-semibold">
              Hidden from readers
            </h2>
            <p className="text-sm text-ink-soft">
              Guides and parameter entries a moderator took out of view. Their history stays; showing one again is audited.
            </p>
            <HiddenList />
          </section>
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
