import { useEffect, useRef } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { toast } from '@/lib/toast';
import { paths } from '@shared/paths';
import { Card, Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { SignInForm } from '@/features/auth/components/sign-in-form';
import { SignUpForm } from '@/features/auth/components/sign-up-form';
import { ForgotPasswordForm, ResetPasswordForm } from '@/features/auth/components/password-reset-forms';
import { useVerifyEmail } from '@/features/auth/api/auth';

function AuthFrame({ title, lead, children }: { title: string; lead: string; children: React.ReactNode }) {
  return (
    <div className="mx-auto max-w-md">
      <Card className="p-6 sm:p-8">
        <h1 className="font-serif text-2xl font-bold">{title}</h1>
        <p className="mt-1 mb-6 text-sm text-ink-soft">{lead}</p>
        {children}
      </Card>
    </div>
  );
}

export function SignInPage() {
  return (
    <AuthFrame title="Sign in" lead="Members write guides, keep their setups and compare them with a baseline.">
      <SignInForm />
    </AuthFrame>
  );
}

export function SignUpPage() {
  return (
    <AuthFrame title="Join Tunewright" lead="Reading is open to everyone. An account lets you write guides, propose edits and keep your own setups.">
      <SignUpForm />
    </AuthFrame>
  );
}

export function ForgotPasswordPage() {
  return (
    <AuthFrame title="Forgot your password?" lead="We will mail you a single-use link to choose a new one.">
      <ForgotPasswordForm />
    </AuthFrame>
  );
}

export function ResetPasswordPage() {
  const [params] = useSearchParams();
  const token = params.get('token');
  return (
    <AuthFrame title="Choose a new password" lead="At least 12 characters; a few unrelated words work well.">
      {token ? (
        <ResetPasswordForm token={token} />
      ) : (
        <Notice tone="danger">
          This link has no token. <Link to="/forgot-password">Ask for a new link</Link>.
        </Notice>
      )}
    </AuthFrame>
  );
}

export function VerifyPage() {
  const [params] = useSearchParams();
  const token = params.get('token');
  const verify = useVerifyEmail();
  const navigate = useNavigate();
  const sent = useRef(false);
  useEffect(() => {
    if (token && !sent.current) {
      sent.current = true;
      verify.mutate(token, {
        // Signed in by the confirmation: straight on to the workbench (replacing the spent link in the history).
        onSuccess: (data) => {
          if (!data.signedIn) return;
          toast.success(`E-mail confirmed. Welcome, ${data.user.displayName}: you are signed in.`);
          navigate(paths.workbench(), { replace: true });
        },
      });
    }
  }, [token, verify, navigate]);
  return (
    <AuthFrame title="Confirm your e-mail" lead="One step between you and your workbench.">
      {!token && <Notice tone="danger">This link has no token. Open the link from the mail again.</Notice>}
      {token && verify.isPending && <Spinner label="Confirming…" />}
      {verify.isSuccess && (
        <Notice tone="ok" title="E-mail confirmed">
          {verify.data.signedIn ? (
            <>
              Thanks, {verify.data.user.displayName}. Opening <Link to={paths.workbench()}>your workbench</Link>…
            </>
          ) : (
            <>
              Thanks, {verify.data.user.displayName}. You can <Link to="/sign-in">sign in</Link> now.
            </>
          )}
        </Notice>
      )}
      {verify.isError && (
        <Notice tone="danger" title="That link did not work">
          {verify.error.message} You can ask for a new one from the <Link to="/sign-in">sign-in page</Link>.
        </Notice>
      )}
    </AuthFrame>
  );
}
