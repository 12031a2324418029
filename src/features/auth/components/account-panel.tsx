import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { toast } from '@/lib/toast';
import { z } from 'zod';
import type { User } from '@shared/schemas/user';
import { changePasswordSchema, updateProfileSchema } from '@shared/schemas/user';
import { Button } from '@/components/ui/button';
import { Card, Chip } from '@/components/ui/card';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { applyServerErrors } from '@/lib/form-errors';
import { useSetUnits } from '@/lib/preferences';
import { useChangePassword, useUpdateProfile } from '../api/auth';

const ROLE_WORDS: Record<User['role'], string> = { member: 'Member', moderator: 'Moderator', admin: 'Administrator' };

export function AccountPanel({ user }: { user: User }) {
  const update = useUpdateProfile();
  const setUnits = useSetUnits();
  const change = useChangePassword();
  const [pwError, setPwError] = useState<string | null>(null);
  const profile = useForm<z.input<typeof updateProfileSchema>>({
    resolver: zodResolver(updateProfileSchema),
    defaultValues: { displayName: user.displayName },
  });
  const password = useForm<z.input<typeof changePasswordSchema>>({
    resolver: zodResolver(changePasswordSchema),
    defaultValues: { currentPassword: '', newPassword: '' },
  });

  const handleProfile = profile.handleSubmit(async (values) => {
    try {
      await update.mutateAsync(values);
      toast.success('Display name saved');
    } catch (err) {
      const msg = applyServerErrors(err, profile.setError, ['displayName']);
      if (msg) toast.error(msg);
    }
  });
  const handlePassword = password.handleSubmit(async (values) => {
    setPwError(null);
    try {
      await change.mutateAsync(values);
      password.reset();
      toast.success('Password changed; your other sessions were signed out.');
    } catch (err) {
      setPwError(applyServerErrors(err, password.setError, ['currentPassword', 'newPassword']));
    }
  });

  return (
    <div className="grid gap-6 md:grid-cols-2">
      <Card className="p-5">
        <h2 className="text-lg font-semibold">Profile</h2>
        <dl className="mt-3 grid grid-cols-[8rem_1fr] gap-y-2 text-sm">
          <dt className="text-ink-muted">E-mail</dt>
          <dd>{user.email}</dd>
          <dt className="text-ink-muted">Role</dt>
          <dd>
            <Chip tone="copper">{ROLE_WORDS[user.role]}</Chip>
          </dd>
          <dt className="text-ink-muted">E-mail confirmed</dt>
          <dd>{user.emailVerified ? 'Yes' : 'Not yet'}</dd>
        </dl>
        <fieldset className="mt-4 text-sm">
          <legend className="font-medium">Units for figures</legend>
          <div className="mt-1 flex flex-wrap gap-x-5 gap-y-1">
            {(
              [
                ['metric', 'Metric (mm, km/h, °C)'],
                ['imperial', 'Imperial (in, mph, °F)'],
              ] as const
            ).map(([value, label]) => (
              <label key={value} className="flex items-center gap-2">
                <input
                  type="radio"
                  name="units"
                  value={value}
                  checked={user.units === value}
                  onChange={() =>
                    setUnits(value).then(
                      () => toast.success(`Figures now show in ${value} units`),
                      () => toast.error('Your units could not be saved; try again.'),
                    )
                  }
                />
                {label}
              </label>
            ))}
          </div>
          <p className="mt-1 text-xs text-ink-muted">Kept with your account, on every device. Also under Display in the header.</p>
        </fieldset>
        <form onSubmit={handleProfile} noValidate className="mt-5 flex flex-col gap-3" aria-label="Profile">
          <TextField label="Display name" error={profile.formState.errors.displayName?.message} {...profile.register('displayName')} />
          <div>
            <Button type="submit" variant="secondary" pending={profile.formState.isSubmitting}>
              Save name
            </Button>
          </div>
        </form>
      </Card>
      <Card className="p-5">
        <h2 className="text-lg font-semibold">Change password</h2>
        <form onSubmit={handlePassword} noValidate className="mt-3 flex flex-col gap-3" aria-label="Change password">
          {pwError && <Notice tone="danger">{pwError}</Notice>}
          <TextField
            label="Current password"
            type="password"
            autoComplete="current-password"
            error={password.formState.errors.currentPassword?.message}
            {...password.register('currentPassword')}
          />
          <TextField
            label="New password"
            type="password"
            autoComplete="new-password"
            error={password.formState.errors.newPassword?.message}
            {...password.register('newPassword')}
          />
          <div>
            <Button type="submit" variant="secondary" pending={password.formState.isSubmitting}>
              Change password
            </Button>
          </div>
        </form>
      </Card>
    </div>
  );
}
