import { useEffect } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link, useParams } from 'react-router-dom';
import { Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { ApiError } from '@/lib/api-client';
import { renderWorkedExample } from '../worked-example';
import { parameterQueries } from '@/features/parameters/api/parameters';
import { ParameterEntry } from '@/features/parameters/components/parameter-entry';
import { useCurrentUser } from '@/features/auth/api/auth';
import { WatchButton } from '@/features/watches/components/watch-button';

// Its own chunk, apart from the library list (src/app/routes/parameters.tsx): a reader landing on one
// entry never downloads the list's table code.
export function ParameterPage() {
  const { slug = '' } = useParams();
  const entry = useQuery(parameterQueries.detail(slug));
  const me = useCurrentUser().data;
  useEffect(() => {
    if (entry.data) document.title = `${entry.data.parameter.name} · Tunewright`;
  }, [entry.data]);
  if (entry.isPending) return <Spinner label="Loading the entry…" />;
  if (entry.isError) {
    const missing = entry.error instanceof ApiError && entry.error.status === 404;
    return (
      <div className="mx-auto max-w-xl">
        <Notice tone={missing ? 'caution' : 'danger'} title={missing ? 'No entry by that name' : 'The entry could not be loaded'}>
          <p>{missing ? `There is no live entry “${slug}” in the library.` : (entry.error as Error).message}</p>
          <p className="mt-2">
            <Link to="/parameters">Browse the parameter library</Link>
          </p>
        </Notice>
      </div>
    );
  }
  return (
    <>
      {me && (
        <div className="no-print mb-3 flex justify-end">
          <WatchButton kind="parameter" slug={slug} />
        </div>
      )}
      <ParameterEntry key={slug} data={entry.data} renderWorkedExample={renderWorkedExample} />
    </>
  );
}
