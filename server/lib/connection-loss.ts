// A lost PostgreSQL connection surfacing as an 'error' event nobody listened for (a driver's idle or half-open client):
// the pools and the listener reconnect by themselves, so the process keeps serving and says so in its log.
const CONNECTION_LOST_CODES = new Set(['57P01', '57P02', '57P03', 'ECONNRESET', 'ECONNREFUSED', 'EPIPE', 'ETIMEDOUT']);
/** Whether an error is PostgreSQL (or the network to it) dropping a connection. */
export function isConnectionLoss(err: unknown) {
  const e = err as { code?: unknown; message?: unknown } | null;
  if (!e || typeof e !== 'object') return false;
  if (typeof e.code === 'string' && CONNECTION_LOST_CODES.has(e.code)) return true;
  return typeof e.message === 'string' && /^Connection terminated|terminating connection due to administrator command/.test(e.message);
}
