import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { toast } from '@/lib/toast';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Dialog } from '@/components/ui/dialog';
import { TextField } from '@/components/ui/field';
import { ApiError } from '@/lib/api-client';
import { useDeleteAccount } from '../api/auth';

/** "Your data": take everything away as one archive, or delete the account (with the password, after saying what goes and what stays). */
export function AccountDataPanel() {
  const [open, setOpen] = useState(false);
  const [password, setPassword] = useState('');
  const [error, setError] = useState<string>();
  const remove = useDeleteAccount();
  const navigate = useNavigate();

  const close = () => {
    setOpen(false);
    setPassword('');
    setError(undefined);
  };
  const handleDelete = async () => {
    if (!password) {
      setError('Enter your current password');
      return;
    }
    try {
      await remove.mutateAsync({ currentPassword: password });
      close();
      toast.success('Your account was deleted. A confirmation is on its way to your mailbox.');
      navigate('/', { replace: true });
    } catch (err) {
      setError(err instanceof ApiError ? (err.fieldErrors.currentPassword ?? err.message) : (err as Error).message);
    }
  };

  return (
    <Card className="p-5" role="region" aria-labelledby="your-data-title">
      <h2 id="your-data-title" className="text-lg font-semibold">
        Your data
      </h2>
      <p className="mt-1 text-sm text-ink-soft">
        Everything that is yours, in one zip archive: profile, drafts and published versions, uploaded setups, run logs with their files, motors and bench
        checks, and what you watch. JSON, CSV and Markdown, with a README that says what each file holds.
      </p>
      <a
        href="/api/account/export"
        download
        className="mt-3 inline-flex rounded-md border border-ink/25 bg-paper-card px-4 py-2 text-sm font-medium text-ink no-underline hover:bg-paper-deep"
      >
        Download my data (zip)
      </a>
      <h3 className="mt-6 font-semibold">Delete my account</h3>
      <p className="mt-1 text-sm text-ink-soft">
        Your profile, drafts, setups, run logs, motors and watch list are removed and you are signed out everywhere. Versions you published stay in the library,
        credited to “Former member”. This cannot be undone; download your data first if you want a copy.
      </p>
      <Button variant="danger" className="mt-3" onClick={() => setOpen(true)}>
        Delete my account…
      </Button>
      <Dialog
        open={open}
        onClose={close}
        title="Delete your account?"
        footer={
          <>
            <Button variant="secondary" onClick={close}>
              Keep my account
            </Button>
            <Button variant="danger" onClick={handleDelete} pending={remove.isPending}>
              Delete my account
            </Button>
          </>
        }
      >
        <p className="text-sm">
          This removes your private data and signs you out on every device. Published versions stay, under “Former member”. Type your password to confirm.
        </p>
        <TextField
          label="Current password"
          type="password"
          autoComplete="current-password"
          value={password}
          onChange={(e) => {
            setPassword(e.target.value);
            setError(undefined);
          }}
          error={error}
        />
      </Dialog>
    </Card>
  );
}
