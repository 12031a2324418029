import { useEffect, useRef } from 'react';
import { Link } from 'react-router-dom';
import { Card, Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { useUnsubscribe } from '../api/watches';

/**
 * The page a mail's "Stop mails" link opens: the click is the whole request (no sign-in, no second
 * button); the signed token in the address says who and what.
 */
export function UnsubscribePanel({ token }: { token: string }) {
  const unsubscribe = useUnsubscribe();
  const sent = useRef(false);
  useEffect(() => {
    if (sent.current || !token) return;
    sent.current = true;
    unsubscribe.mutate(token);
  }, [token, unsubscribe]);
  if (!token || unsubscribe.isError)
    return (
      <Notice tone="danger" title="This link does not work">
        <p>{unsubscribe.error?.message ?? 'The link is missing its token. Open it from the mail again.'}</p>
        <p className="mt-2">
          You can also change your mails on <Link to="/account#watching">your account page</Link>.
        </p>
      </Notice>
    );
  if (!unsubscribe.data) return <Spinner label="Stopping the mails…" />;
  const r = unsubscribe.data;
  const href = r.kind && r.slug ? (r.kind === 'guide' ? `/guides/${r.slug}` : `/parameters/${r.slug}`) : null;
  return (
    <Card className="p-6" role="status">
      <h1 className="font-serif text-2xl font-bold">No more of these mails</h1>
      {r.scope === 'all' ? (
        <p className="mt-2">You will get no mails about what you watch. Your watch list is kept; turn the mails back on from your account page.</p>
      ) : (
        <p className="mt-2">You no longer watch {href ? <Link to={href}>{r.title}</Link> : 'that page'}. Press “Watch” on it to follow it again.</p>
      )}
      <p className="mt-4 text-sm">
        <Link to="/account#watching">Your mail settings</Link>
      </p>
    </Card>
  );
}
