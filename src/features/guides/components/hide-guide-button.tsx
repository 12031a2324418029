import { useState } from 'react';
import { toast } from 'sonner';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { TextAreaField } from '@/components/ui/field';
import { useHideGuide } from '../api/guides';

/** Moderator: hide a guide for abuse, with a required reason kept in the audit log. */
export function HideGuideButton({ slug, onHidden }: { slug: string; onHidden?: () => void }) {
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
      <Button variant="ghost" size="sm" onClick={() => setOpen(true)}>
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
          <p className="text-sm text-ink-soft">Readers will no longer see it. Its history stays, and a moderator can bring it back.</p>
          <TextAreaField label="Reason" rows={3} value={reason} onChange={(e) => setReason(e.target.value)} error={error} required />
        </div>
      </Dialog>
    </>
  );
}
