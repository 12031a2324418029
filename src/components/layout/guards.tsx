import type { ReactNode } from 'react';
import { Link, useLocation } from 'react-router-dom';
import { hasRole, type Role } from '@shared/constants';
import type { User } from '@shared/schemas/user';
import { useCurrentUser } from '@/features/auth/api/auth';
import { Card, Spinner } from '@/components/ui/card';

export function SignInRequired() {
  const location = useLocation();
  return (
    <Card className="mx-auto max-w-lg p-8 text-center">
      <h1 className="font-serif text-2xl font-bold">Sign in to continue</h1>
      <p className="mt-2 text-ink-soft">This page belongs to a signed-in account.</p>
      <Link
        to={`/sign-in?next=${encodeURIComponent(location.pathname + location.search)}`}
        className="mt-5 inline-block rounded-md bg-copper px-4 py-2 font-medium text-white no-underline hover:bg-copper-dark"
      >
        Sign in
      </Link>
    </Card>
  );
}

export function NotAllowed({ role }: { role: Role }) {
  return (
    <Card className="mx-auto max-w-lg p-8 text-center">
      <h1 className="font-serif text-2xl font-bold">Not allowed</h1>
      <p className="mt-2 text-ink-soft">
        This page is for {role === 'admin' ? 'administrators' : role === 'moderator' ? 'moderators' : 'members'}. If you think you should have access, ask an
        administrator of the club.
      </p>
      <Link to="/" className="mt-5 inline-block">
        Back to the start page
      </Link>
    </Card>
  );
}

/** Renders children only for a signed-in account of at least `role`. The server enforces the same rule. */
export function RequireRole({ role, children }: { role: Role; children: (user: User) => ReactNode }) {
  const me = useCurrentUser();
  if (me.isPending) return <Spinner />;
  if (!me.data) return <SignInRequired />;
  if (!hasRole(me.data, role)) return <NotAllowed role={role} />;
  return <>{children(me.data)}</>;
}
