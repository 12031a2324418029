import { Link } from 'react-router-dom';
import { toast } from '@/lib/toast';
import type { SetupUpload } from '@shared/schemas/setup';
import { Button } from '@/components/ui/button';
import { useDeleteUpload } from '../api/setups';
import { classLabel, fmt } from './labels';

/** The member's own uploads, newest first, with compare, download and delete. */
export function UploadsList({ uploads }: { uploads: Omit<SetupUpload, 'record'>[] }) {
  const remove = useDeleteUpload();
  if (!uploads.length) return <p className="text-sm text-ink-muted">You have not uploaded a setup yet.</p>;
  const handleDelete = async (u: Omit<SetupUpload, 'record'>) => {
    if (!window.confirm(`Delete ${u.originalName}? This cannot be undone.`)) return;
    await remove.mutateAsync(u.id);
    toast.success(`Deleted ${u.originalName}`);
  };
  return (
    <ul className="divide-y divide-paper-line rounded-lg border border-paper-line bg-paper-card" data-testid="uploads-list">
      {uploads.map((u) => (
        <li key={u.id} className="flex flex-wrap items-center gap-x-4 gap-y-1 px-3 py-2 text-sm">
          <span className="min-w-0 flex-1">
            <span className="font-medium break-all">{u.originalName}</span>
            <span className="block text-xs text-ink-muted">
              {classLabel(u.summary.class)} · {u.summary.motor} · {u.summary.finalDriveRatio === null ? '—' : `${fmt(u.summary.finalDriveRatio)}:1`} ·{' '}
              {u.summary.pack} · {new Date(u.createdAt).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' })}
            </span>
          </span>
          <Link to={`/setups/compare?b=${u.id}`}>Compare</Link>
          <a href={`/api/setups/${u.id}/download`} download>
            Download
          </a>
          <Button type="button" variant="ghost" size="sm" onClick={() => handleDelete(u)} pending={remove.isPending && remove.variables === u.id}>
            Delete
          </Button>
        </li>
      ))}
    </ul>
  );
}
