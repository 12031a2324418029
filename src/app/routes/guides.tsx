import { useEffect } from 'react';
import { Link } from 'react-router-dom';
import { PageHeader } from '@/components/ui/card';
import { useCurrentUser } from '@/features/auth/api/auth';
import { GuideFiltersBar, useGuideFilters } from '@/features/guides/components/guide-filters';
import { GuideList } from '@/features/guides/components/guide-list';

export function GuidesPage() {
  const [filters] = useGuideFilters();
  const me = useCurrentUser().data;
  useEffect(() => {
    document.title = 'Guides · Tunewright';
  }, []);
  return (
    <>
      <PageHeader
        eyebrow="Tuners’ guides"
        title="Guides"
        actions={
          me ? (
            <Link to="/guides/new" className="rounded-md bg-copper px-4 py-2 font-medium text-white no-underline hover:bg-copper-dark">
              Write a guide
            </Link>
          ) : undefined
        }
      >
        Setups and reasoning for one class on one surface, written by experienced tuners and checked by a moderator before they go live.{' '}
        <Link to="/changes">See recent changes</Link>.
      </PageHeader>
      <div className="flex flex-col gap-6">
        <GuideFiltersBar />
        <GuideList filters={filters} />
      </div>
    </>
  );
}
