import { useLocation } from 'react-router-dom';
import { Notice } from '@/components/ui/notice';
import { useSavedCopy } from '@/lib/offline/saved-copy';
import { applyWaitingUpdate, useUpdateWaiting } from '@/lib/offline/update';

const savedAtFormat = new Intl.DateTimeFormat(undefined, { dateStyle: 'medium', timeStyle: 'short' });

/** Says that the page shows what this device stored earlier, and when that was. */
export function SavedCopyNotice() {
  const { pathname } = useLocation();
  const savedAt = useSavedCopy(pathname);
  if (!savedAt) return null;
  return (
    <div role="status" data-testid="saved-copy-notice" data-saved-at={savedAt.toISOString()}>
      <Notice tone="caution" title={`Saved copy from ${savedAtFormat.format(savedAt)}`} className="mb-6">
        Tunewright cannot be reached right now, so this page shows what this device stored then. It may have changed since; check again when you have a signal.
      </Notice>
    </div>
  );
}

/** A new version is installed and waiting: it takes over at the next page change, or now on request. */
export function UpdateNotice() {
  const waiting = useUpdateWaiting();
  if (!waiting) return null;
  return (
    <div role="status" className="no-print mb-6" data-testid="update-notice">
      <Notice tone="info" title="A new version of Tunewright is ready">
        <p>It starts when you open another page. Drafts are kept in this browser either way.</p>
        <button type="button" onClick={() => applyWaitingUpdate()} className="mt-2 rounded-md border border-ink/20 px-2.5 py-1 text-sm hover:bg-paper-deep">
          Reload now
        </button>
      </Notice>
    </div>
  );
}
