import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { toast } from '@/lib/toast';
import { signInSchema, type SignInInput } from '@shared/schemas/user';
import { safeNext } from '@shared/safe-next';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { ApiError } from '@/lib/api-client';
import { applyServerErrors } from '@/lib/form-errors';
import { useResendVerification, useSignIn } from '../api/auth';

export function SignInForm() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const signIn = useSignIn();
  const resend = useResendVerification();
  const [formError, setFormError] = useState<string | null>(null);
  const [unverified, setUnverified] = useState(false);
  const form = useForm<SignInInput>({ resolver: zodResolver(signInSchema), defaultValues: { email: '', password: '' } });

  const handleSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    setUnverified(false);
    try {
      const user = await signIn.mutateAsync(values);
      toast.success(`Signed in as ${user.displayName}`);
      navigate(safeNext(params.get('next')), { replace: true });
    } catch (err) {
      if (err instanceof ApiError && err.code === 'email_unverified') setUnverified(true);
      setFormError(applyServerErrors(err, form.setError, ['email', 'password']));
    }
  });

  const handleResend = async () => {
    await resend.mutateAsync(form.getValues('email'));
    toast.success('If that account is waiting for confirmation, a new link is on its way.');
  };

  const { errors } = form.formState;
  return (
    <form onSubmit={handleSubmit} noValidate className="flex flex-col gap-4" aria-label="Sign in">
      {formError && (
        <Notice tone="danger" title="Could not sign in">
          {formError}
          {unverified && (
            <div className="mt-2">
              <Button type="button" size="sm" variant="secondary" onClick={handleResend} pending={resend.isPending}>
                Send a new confirmation link
              </Button>
            </div>
          )}
        </Notice>
      )}
      <TextField label="E-mail" type="email" autoComplete="email" error={errors.email?.message} {...form.register('email')} />
      <TextField label="Password" type="password" autoComplete="current-password" error={errors.password?.message} {...form.register('password')} />
      <div className="flex flex-wrap items-center justify-between gap-3">
        <Button type="submit" pending={form.formState.isSubmitting}>
          Sign in
        </Button>
        <Link to="/forgot-password" className="text-sm">
          Forgot your password?
        </Link>
      </div>
      <p className="text-sm text-ink-muted">
        New here? <Link to="/sign-up">Create an account</Link> to write guides and keep your setups.
      </p>
    </form>
  );
}
