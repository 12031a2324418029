import { useQuery } from '@tanstack/react-query';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { PageHeader } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { guideQueries } from '@/features/guides/api/guides';
import { CompareView } from '@/features/guides/components/compare-view';

export function GuideComparePage() {
  const { slug = '' } = useParams();
  const [params] = useSearchParams();
  const from = Number(params.get('from'));
  const to = Number(params.get('to'));
  const detail = useQuery(guideQueries.detail(slug));
  const valid = Number.isInteger(from) && Number.isInteger(to) && from > 0 && to > 0;
  return (
    <>
      <PageHeader eyebrow="Compare versions" title={detail.data?.revision.content.title ?? 'Guide'}>
        {valid ? `Version ${from} against version ${to}.` : 'Pick two versions from the history.'}{' '}
        <Link to={`/guides/${slug}#history`}>Back to the guide and its history</Link>
      </PageHeader>
      {valid ? (
        <CompareView slug={slug} from={from} to={to} />
      ) : (
        <Notice tone="caution" title="Two version numbers are needed">
          Open the guide’s history and choose the versions to compare.
        </Notice>
      )}
    </>
  );
}
