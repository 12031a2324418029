import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { toast } from '@/lib/toast';
import { z } from 'zod';
import { forgotPasswordSchema, passwordSchema } from '@shared/schemas/user';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { applyServerErrors } from '@/lib/form-errors';
import { useForgotPassword, useResetPassword } from '../api/auth';

export function ForgotPasswordForm() {
  const forgot = useForgotPassword();
  const [done, setDone] = useState(false);
  const form = useForm<z.input<typeof forgotPasswordSchema>>({ resolver: zodResolver(forgotPasswordSchema), defaultValues: { email: '' } });
  const handleSubmit = form.handleSubmit(async ({ email }) => {
    await forgot.mutateAsync(email);
    setDone(true);
  });
  if (done) {
    return (
      <Notice tone="ok" title="Check your mail">
        If an account uses that address, a reset link is on its way. It works once and expires in one hour.
      </Notice>
    );
  }
  return (
    <form onSubmit={handleSubmit} noValidate className="flex flex-col gap-4" aria-label="Reset password">
      {forgot.error && <Notice tone="danger">{forgot.error.message}</Notice>}
      <TextField label="E-mail" type="email" autoComplete="email" error={form.formState.errors.email?.message} {...form.register('email')} />
      <div>
        <Button type="submit" pending={form.formState.isSubmitting}>
          Send reset link
        </Button>
      </div>
    </form>
  );
}

const resetForm = z
  .object({ password: passwordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords differ' });

export function ResetPasswordForm({ token }: { token: string }) {
  const reset = useResetPassword();
  const navigate = useNavigate();
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<z.input<typeof resetForm>>({ resolver: zodResolver(resetForm), defaultValues: { password: '', confirm: '' } });
  const handleSubmit = form.handleSubmit(async ({ password }) => {
    setFormError(null);
    try {
      await reset.mutateAsync({ token, password });
      toast.success('Password changed. Sign in with the new one.');
      navigate('/sign-in', { replace: true });
    } catch (err) {
      setFormError(applyServerErrors(err, form.setError, ['password']));
    }
  });
  return (
    <form onSubmit={handleSubmit} noValidate className="flex flex-col gap-4" aria-label="Choose a new password">
      {formError && (
        <Notice tone="danger">
          {formError} <Link to="/forgot-password">Ask for a new link</Link>.
        </Notice>
      )}
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        error={form.formState.errors.password?.message}
        {...form.register('password')}
      />
      <TextField label="Repeat it" type="password" autoComplete="new-password" error={form.formState.errors.confirm?.message} {...form.register('confirm')} />
      <div>
        <Button type="submit" pending={form.formState.isSubmitting}>
          Save new password
        </Button>
      </div>
    </form>
  );
}
