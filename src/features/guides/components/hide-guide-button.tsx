import { useEffect, useRef, useState } from 'react';
import { toast } from '@/lib/toast';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { TextAreaField } from '@/components/ui/field';
import { useHideGuide, useUnhideGuide } from '../api/guides';

/**
 * Focuses the element when asked to: it replaces a control that just went away. The request may come
 * just before or just after the element appears (the refetch and the callback race), so both count.
 */
function useFocusOnMount<T extends HTMLElement>(wanted: boolean | undefined) {
  const ref = useRef<T>(null);
  useEffect(() => {
    if (wanted) ref.current?.focus();
  }, [wanted]);
  return ref;
}

/** Moderator: hide a guide for abuse, with a required reason kept in the audit log. */
export function HideGuideButton({ slug, onHidden, focusOnMount }: { slug: string; onHidden?: () => void; focusOnMount?: boolean }) {
  const buttonRef = useFocusOnMount<HTMLButtonElement>(focusOnMount);
  const [open, setOpen] = useState(false);
  const [reason, setReason] = useState('');
  const [error, setError] = useState<string>();
  const hide = useHideGuide(slug);
  const handleHide = async () => {
    if (reason.trim().length < 3) {
      setError('Say why the guide is hidden (the author and other moderators will see it).');
      return;
    }
    try {
      await hide.mutateAsync(reason.trim());
      toast.success('The guide is hidden from readers');
      setOpen(false);
      onHidden?.();
    } catch (err) {
      setError((err as Error).message);
    }
  };
  return (
    <>
      <Button ref={buttonRef} variant="ghost" size="sm" onClick={() => setOpen(true)}>
        Hide guide
      </Button>
      <Dialog
        open={open}
        onClose={() => setOpen(false)}
        title="Hide this guide?"
        footer={
          <>
            <Button variant="secondary" onClick={() => setOpen(false)}>
              Cancel
            </Button>
            <Button variant="danger" onClick={handleHide} pending={hide.isPending}>
              Hide guide
            </Button>
          </>
        }
      >
        <div className="flex flex-col gap-3">
          <p className="text-sm text-ink-soft">Readers will no longer see it or find it in search. Its history stays, and a moderator can bring it back.</p>
          <TextAreaField label="Reason" rows={3} value={reason} onChange={(e) => setReason(e.target.value)} error={error} required />
        </div>
      </Dialog>
    </>
  );
}

/** Moderator: show a hidden guide to readers again (the hiding stays in the audit log). */
export function UnhideGuideButton({ slug, onShown, focusOnMount }: { slug: string; onShown?: () => void; focusOnMount?: boolean }) {
  const unhide = useUnhideGuide(slug);
  const buttonRef = useFocusOnMount<HTMLButtonElement>(focusOnMount);
  const handleUnhide = async () => {
    try {
      await unhide.mutateAsync();
      toast.success('The guide is visible to readers again');
      onShown?.();
    } catch (err) {
      toast.error((err as Error).message);
    }
  };
  return (
    <Button ref={buttonRef} variant="secondary" size="sm" className="mt-2" onClick={handleUnhide} pending={unhide.isPending}>
      Show it to readers again
    </Button>
  );
}
