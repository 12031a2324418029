import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { signUpSchema, type SignUpInput } from '@shared/schemas/user';
import { LIMITS } from '@shared/constants';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { applyServerErrors } from '@/lib/form-errors';
import { useSignUp } from '../api/auth';

export function SignUpForm() {
  const signUp = useSignUp();
  const [formError, setFormError] = useState<string | null>(null);
  const [sentTo, setSentTo] = useState<string | null>(null);
  const form = useForm<SignUpInput>({ resolver: zodResolver(signUpSchema), defaultValues: { email: '', displayName: '', password: '' } });

  const handleSubmit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      const accepted = await signUp.mutateAsync(values);
      setSentTo(accepted.email);
    } catch (err) {
      setFormError(applyServerErrors(err, form.setError, ['email', 'displayName', 'password']));
    }
  });

  if (sentTo) {
    return (
      <Notice tone="ok" title="Check your mail">
        We sent a mail to <strong>{sentTo}</strong>. Open its confirmation link to finish setting up your account, then <Link to="/sign-in">sign in</Link>. If
        the address already has an account, the mail says so instead.
      </Notice>
    );
  }

  const { errors } = form.formState;
  return (
    <form onSubmit={handleSubmit} noValidate className="flex flex-col gap-4" aria-label="Create an account">
      {formError && (
        <Notice tone="danger" title="Could not create the account">
          {formError}
        </Notice>
      )}
      <TextField label="E-mail" type="email" autoComplete="email" error={errors.email?.message} {...form.register('email')} />
      <TextField
        label="Display name"
        autoComplete="nickname"
        hint="Shown on the guides you write."
        error={errors.displayName?.message}
        {...form.register('displayName')}
      />
      <TextField
        label="Password"
        type="password"
        autoComplete="new-password"
        hint={`At least ${LIMITS.passwordMin} characters. A few unrelated words work well; common passwords are refused.`}
        error={errors.password?.message}
        {...form.register('password')}
      />
      <div>
        <Button type="submit" pending={form.formState.isSubmitting}>
          Create account
        </Button>
      </div>
      <p className="text-sm text-ink-muted">
        Already have an account? <Link to="/sign-in">Sign in</Link>.
      </p>
    </form>
  );
}
