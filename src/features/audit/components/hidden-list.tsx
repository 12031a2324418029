import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { toast } from '@/lib/toast';
import { documentPath } from '@shared/paths';
import type { HiddenDocument } from '@shared/schemas/audit';
import { Button } from '@/components/ui/button';
import { Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { auditQueries, useShowAgain } from '../api/audit';

const when = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric' });

function Row({ d }: { d: HiddenDocument }) {
  const show = useShowAgain();
  const handleShow = async () => {
    try {
      await show.mutateAsync({ kind: d.kind, slug: d.slug });
      toast.success(`“${d.title}” is visible to readers again`);
    } catch (err) {
      toast.error((err as Error).message);
    }
  };
  return (
    <li className="flex flex-col gap-2 py-3 sm:flex-row sm:items-start sm:justify-between">
      <div className="flex min-w-0 flex-col gap-0.5 text-sm">
        <Link to={documentPath(d.kind, d.slug)} className="font-semibold break-words">
          {d.title}
        </Link>
        <span className="text-xs text-ink-muted">
          {d.kind === 'guide' ? 'Guide' : 'Parameter entry'} · hidden {when.format(new Date(d.hiddenAt))}
          {d.hiddenBy && <> by {d.hiddenBy.displayName}</>}
        </span>
        <span className="break-words text-ink-soft">Reason: {d.reason || '—'}</span>
      </div>
      <Button size="sm" variant="secondary" onClick={handleShow} pending={show.isPending} aria-label={`Show “${d.title}” again`}>
        Show again
      </Button>
    </li>
  );
}

/** Moderators: everything hidden from readers, with who hid it and why, and a way to bring each back. */
export function HiddenList() {
  const q = useQuery(auditQueries.hidden());
  if (q.isPending) return <Spinner label="Loading hidden pages…" />;
  if (q.isError)
    return (
      <Notice tone="danger" title="The hidden pages could not be loaded">
        {q.error.message}
      </Notice>
    );
  if (q.data.length === 0) return <p className="text-sm text-ink-soft">Nothing is hidden from readers.</p>;
  return (
    <ul className="flex flex-col divide-y divide-paper-line border-y border-paper-line" aria-label="Hidden from readers">
      {q.data.map((d) => (
        <Row key={`${d.kind}-${d.slug}`} d={d} />
      ))}
    </ul>
  );
}
