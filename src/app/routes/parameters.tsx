import { useEffect } from 'react';
import { useQuery } from '@tanstack/react-query';
import { PageHeader, Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { parameterQueries } from '@/features/parameters/api/parameters';
import { ParameterLibrary } from '@/features/parameters/components/parameter-library';

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
