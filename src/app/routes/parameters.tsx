import { useEffect } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link, useParams } from 'react-router-dom';
import { PageHeader, Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { ApiError } from '@/lib/api-client';
import { renderWorkedExample } from '../worked-example';
import { parameterQueries } from '@/features/parameters/api/parameters';
import { ParameterEntry } from '@/features/parameters/components/parameter-entry';
import { ParameterLibrary } from '@/features/parameters/components/parameter-library';
import { useCurrentUser } from '@/features/auth/api/auth';
import { WatchButton } from '@/features/watches/components/watch-button';

export function ParametersPage() {
  const list = useQuery(parameterQueries.list());
  useEffect(() => {
    document.title = 'Parameter library · Tunewright';
  }, []);
  // Category links from entry pages land on their heading once the table is drawn: PageScroll waits for it.
  return (
    <div>
      <PageHeader eyebrow="Reference" title="Parameter library">
        Every common speed-controller, motor, gearing and battery setting in plain words: what it does, which way to move it, what it costs in heat and run
        time, and where it can hurt equipment or people. Settings are described generically — your controller may name them differently.
      </PageHeader>
      {list.isPending && <Spinner label="Loading the library…" />}
      {list.isError && (
        <Notice tone="danger" title="The library could not be loaded">
          {(list.error as Error).message}{' '}
          <button type="button" className="underline" onClick={() => list.refetch()}>
            Try again
          </button>
        </Notice>
      )}
      {list.data && <ParameterLibrary parameters={list.data} />}
    </div>
  );
}

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
