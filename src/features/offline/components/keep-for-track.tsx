import { useState } from 'react';
import { api, type Envelope } from '@/lib/api-client';
import { keepOffline } from '@/lib/offline/worker';

const keptKey = (slug: string) => `tw:kept:${slug}`;
const keptFormat = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });

function readKept(slug: string): Date | null {
  try {
    const raw = localStorage.getItem(keptKey(slug));
    const at = raw ? new Date(raw) : null;
    return at && !Number.isNaN(at.getTime()) ? at : null;
  } catch {
    return null;
  }
}

/**
 * What a guide needs to be read at the track: its page and API reads, its baseline setup, the parameter
 * entries it links to (pages and reads), and for a member their own setups and runs.
 */
async function trackKit(slug: string, parameters: string[], signedIn: boolean) {
  const s = encodeURIComponent(slug);
  const pages = [`/guides/${s}`, ...parameters.map((p) => `/parameters/${encodeURIComponent(p)}`)];
  const reads = [
    '/api/auth/me',
    '/api/taxonomy',
    '/api/parameters',
    `/api/guides/${s}`,
    `/api/guides/${s}/setup`,
    `/api/guides/${s}/revisions`,
    `/api/guides/${s}/evidence`,
    ...parameters.map((p) => `/api/parameters/${encodeURIComponent(p)}`),
  ];
  if (signedIn) {
    pages.push('/setups', '/runs');
    reads.push('/api/setups', '/api/setups/esc-settings', '/api/runs');
    // Each run's own page reads it by id: store those too (the list says which there are).
    const runs = await api.get<Envelope<Array<{ id: string }>>>('/api/runs').catch(() => ({ data: [] }));
    for (const run of runs.data.slice(0, 50)) reads.push(`/api/runs/${encodeURIComponent(run.id)}`);
  }
  return { pages, reads };
}

/** "Keep for the track": stores a guide and what it links to on this device, for reading without a signal. */
export function KeepForTrackButton({ slug, parameters, signedIn }: { slug: string; parameters: string[]; signedIn: boolean }) {
  const [kept, setKept] = useState<Date | null>(() => readKept(slug));
  const [state, setState] = useState<{ kind: 'idle' } | { kind: 'saving' } | { kind: 'error'; message: string }>({ kind: 'idle' });

  const handleKeep = async () => {
    setState({ kind: 'saving' });
    try {
      const { pages, reads } = await trackKit(slug, parameters, signedIn);
      const result = await keepOffline(pages, reads);
      if (result.saved === 0) throw new Error('Nothing could be saved. Check the connection and try again.');
      const at = new Date(result.at);
      try {
        localStorage.setItem(keptKey(slug), result.at);
      } catch {
        /* the copy is stored anyway; only the date shown here is lost */
      }
      setKept(at);
      setState(
        result.failed.length
          ? { kind: 'error', message: `Kept, but ${result.failed.length} of ${result.failed.length + result.saved} parts could not be fetched.` }
          : { kind: 'idle' },
      );
    } catch (err) {
      setState({ kind: 'error', message: (err as Error).message });
    }
  };

  return (
    <span className="inline-flex flex-col gap-1" data-testid="keep-for-track">
      <button
        type="button"
        onClick={handleKeep}
        disabled={state.kind === 'saving'}
        className="rounded-md border border-ink/20 px-3 py-1.5 text-sm font-medium hover:bg-paper-deep disabled:opacity-60"
      >
        {state.kind === 'saving' ? 'Keeping for the track…' : kept ? 'Update the copy for the track' : 'Keep for the track'}
      </button>
      <span role="status" className="text-xs text-ink-soft">
        {state.kind === 'error'
          ? state.message
          : kept
            ? `Kept on this device ${keptFormat.format(kept)}${signedIn ? ', with your setups and runs' : ''}. Signing out removes your own part.`
            : ''}
      </span>
    </span>
  );
}
