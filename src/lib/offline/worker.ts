import type { KeepResult, WorkerMessage } from '@shared/offline';
import { PRIVATE_CACHE } from '@shared/offline';

/**
 * Talking to the service worker from the page. Everything here is a no-op where the browser has no
 * service workers (or the page is not on a secure origin): the app works as before, just not offline.
 */

const supported = () => typeof navigator !== 'undefined' && 'serviceWorker' in navigator && window.isSecureContext;

/** Sends a message to the active worker and waits for its answer on a private port. */
async function ask<T>(message: WorkerMessage, timeoutMs: number): Promise<T> {
  if (!supported()) throw new Error('This browser cannot keep pages for offline reading.');
  const registration = await Promise.race([
    navigator.serviceWorker.ready,
    new Promise<never>((_, reject) => setTimeout(() => reject(new Error('The offline store is not ready yet. Try again in a moment.')), timeoutMs)),
  ]);
  const worker = registration.active;
  if (!worker) throw new Error('The offline store is not ready yet. Try again in a moment.');
  return new Promise<T>((resolve, reject) => {
    const channel = new MessageChannel();
    const timer = setTimeout(() => reject(new Error('Saving for offline use took too long. Check the connection and try again.')), timeoutMs);
    channel.port1.onmessage = (e) => {
      clearTimeout(timer);
      resolve(e.data as T);
    };
    worker.postMessage(message, [channel.port2]);
  });
}

/** Asks the worker to fetch and store these pages and API reads; resolves with what it stored. */
export function keepOffline(pages: string[], api: string[]): Promise<KeepResult> {
  return ask<KeepResult>({ type: 'KEEP', pages, api }, 60_000);
}

/**
 * Removes everything stored for the member who was signed in: called on sign-out and on every sign-in
 * (a session may have ended without a sign-out). Deletes the cache from the page too, so it is gone even
 * when no worker is running.
 */
export async function forgetPrivateData(): Promise<void> {
  if (!supported()) return;
  await caches.delete(PRIVATE_CACHE).catch(() => false);
  if (navigator.serviceWorker.controller) await ask({ type: 'FORGET_PRIVATE' }, 5_000).catch(() => undefined);
}
