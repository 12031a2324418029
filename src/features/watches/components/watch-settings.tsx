import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { toast } from '@/lib/toast';
import { WATCH_DELIVERIES, WATCH_DELIVERY_LABELS, type WatchDelivery } from '@shared/schemas/watch';
import { Card, Spinner } from '@/components/ui/card';
import { useSetDelivery, useSetWatching, watchQueries } from '../api/watches';
import { Button } from '@/components/ui/button';
import type { Watch } from '@shared/schemas/watch';

function UnwatchButton({ w }: { w: Watch }) {
  const set = useSetWatching(w.kind, w.slug);
  return (
    <Button variant="ghost" size="sm" pending={set.isPending} onClick={() => set.mutate(false)} aria-label={`Stop watching ${w.title}`}>
      Stop watching
    </Button>
  );
}

/** The account page's "What you watch": how mails come, and the list. */
export function WatchSettingsPanel() {
  const settings = useQuery(watchQueries.settings());
  const mine = useQuery(watchQueries.mine());
  const setDelivery = useSetDelivery();
  const handleChange = async (delivery: WatchDelivery) => {
    try {
      await setDelivery.mutateAsync(delivery);
      toast.success('Saved');
    } catch (err) {
      toast.error((err as Error).message);
    }
  };
  return (
    <Card className="p-5" id="watching">
      <h2 className="text-lg font-semibold">What you watch</h2>
      <p className="mt-1 text-sm text-ink-soft">
        You get a mail when a guide or entry you watch gets a new live version, is restored or is hidden. You watch what you write.
      </p>
      {settings.data ? (
        <fieldset className="mt-4">
          <legend className="text-sm font-medium">Mails about changes</legend>
          <div className="mt-2 flex flex-col gap-1.5">
            {WATCH_DELIVERIES.map((d) => (
              <label key={d} className="flex items-center gap-2 text-sm">
                <input type="radio" name="watch-delivery" value={d} checked={settings.data.delivery === d} onChange={() => handleChange(d)} />
                {WATCH_DELIVERY_LABELS[d]}
              </label>
            ))}
          </div>
        </fieldset>
      ) : (
        <Spinner label="Loading your settings…" />
      )}
      <h3 className="mt-5 text-sm font-medium">Watching</h3>
      {mine.data && mine.data.length === 0 && <p className="mt-1 text-sm text-ink-soft">Nothing yet. Use “Watch” on a guide or a parameter entry.</p>}
      <ul className="mt-2 divide-y divide-paper-line">
        {mine.data?.map((w) => (
          <li key={`${w.kind}/${w.slug}`} className="flex items-center justify-between gap-3 py-2 text-sm">
            <Link to={w.kind === 'guide' ? `/guides/${w.slug}` : `/parameters/${w.slug}`}>{w.title}</Link>
            <UnwatchButton w={w} />
          </li>
        ))}
      </ul>
    </Card>
  );
}
