import { useQuery } from '@tanstack/react-query';
import { toast } from '@/lib/toast';
import type { DocumentKind } from '@shared/constants';
import { Button } from '@/components/ui/button';
import { useSetWatching, watchQueries } from '../api/watches';

/** Watch / stop watching a guide or parameter entry (signed-in readers). A toggle button: aria-pressed says which. */
export function WatchButton({ kind, slug }: { kind: DocumentKind; slug: string }) {
  const state = useQuery(watchQueries.state(kind, slug));
  const set = useSetWatching(kind, slug);
  if (state.isError) return null;
  const watching = !!state.data?.watching;
  const noun = kind === 'guide' ? 'guide' : 'entry';
  const handleClick = async () => {
    try {
      await set.mutateAsync(!watching);
      toast.success(watching ? `You no longer watch this ${noun}` : `Watching: you get a mail when this ${noun} changes`);
    } catch (err) {
      toast.error((err as Error).message);
    }
  };
  return (
    <Button
      variant="secondary"
      size="sm"
      aria-pressed={watching}
      disabled={state.isPending}
      pending={set.isPending}
      onClick={handleClick}
      title={watching ? 'Stop the mails about changes' : 'Get a mail when a new version goes live, is restored or hidden'}
    >
      {watching ? 'Watching' : 'Watch'}
    </Button>
  );
}
