import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { Card, Spinner } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { devMailQueries } from '../api/mail';

/** Turns bare links in plain text into anchors; the rest stays text (no HTML from mail is rendered). */
function Linkified({ text }: { text: string }) {
  const parts = text.split(/(https?:\/\/[^\s]+)/g);
  return (
    <>
      {parts.map((p, i) =>
        /^https?:\/\//.test(p) ? (
          <a key={i} href={p.replace(/^https?:\/\/[^/]+/, '')} className="break-all">
            {p}
          </a>
        ) : (
          <span key={i}>{p}</span>
        ),
      )}
    </>
  );
}

export function Mailbox() {
  const list = useQuery(devMailQueries.list());
  const [openId, setOpenId] = useState<string | null>(null);
  if (list.isPending) return <Spinner />;
  if (list.isError) return <Notice tone="danger">{list.error.message}</Notice>;
  if (list.data.length === 0) return <Notice>No mail yet. Sign up or ask for a password reset and it appears here within a few seconds.</Notice>;
  return (
    <ul className="flex flex-col gap-3" aria-label="Captured mail">
      {list.data.map((m) => {
        const open = openId === m.id || (openId === null && m === list.data[0]);
        return (
          <li key={m.id}>
            <Card className="p-4">
              <button
                type="button"
                className="flex w-full flex-wrap items-baseline justify-between gap-2 text-left"
                onClick={() => setOpenId(open ? '' : m.id)}
                aria-expanded={open}
              >
                <span className="font-semibold">{m.subject}</span>
                <span className="text-xs text-ink-muted">
                  to {m.to} · {new Date(m.receivedAt).toLocaleString()}
                </span>
              </button>
              {open && (
                <pre className="mt-3 font-sans text-sm whitespace-pre-wrap">
                  <Linkified text={m.text} />
                </pre>
              )}
            </Card>
          </li>
        );
      })}
    </ul>
  );
}
