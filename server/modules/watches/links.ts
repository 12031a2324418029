import type { AppContext } from '../../context';
import type { Unsubscribe } from './mail';
import { signUnsubscribe } from './tokens';

/** The page link (in the mail body) and the RFC 8058 one-click address (in the headers) for one person. */
export function unsubscribeLinks(ctx: AppContext, userId: string, documentId?: string): Unsubscribe {
  const token = signUnsubscribe(ctx.config.sessionSecret, documentId ? { u: userId, d: documentId } : { u: userId });
  return { pageUrl: `${ctx.config.appUrl}/unsubscribe?token=${token}`, oneClickUrl: `${ctx.config.appUrl}/unsubscribe/one-click?token=${token}` };
}
