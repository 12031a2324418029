/**
 * What the service worker (src/sw.ts) and the page agree on: cache names, the headers that mark a saved
 * copy and a signed-in answer, and the messages the page sends. Plain constants, so both sides import them.
 */

/** Pages (HTML) and API answers read without a session: anyone on this device may see them. */
export const PUBLIC_CACHE = 'tw-public-v1';
/** Everything answered to a signed-in member (their setups, runs, drafts, and pages carrying their name). */
export const PRIVATE_CACHE = 'tw-private-v1';
/** How many public entries are kept before the oldest go. Private entries go at sign-out. */
export const PUBLIC_CACHE_MAX_ENTRIES = 200;

/** Set by the server on every answer to a request with a session (server/app.ts). */
export const PRIVATE_HEADER = 'x-tunewright-private';
/** Set by the worker on a stored copy: when it was fetched from the server (ISO 8601). */
export const SAVED_AT_HEADER = 'x-tunewright-saved-at';
/** Put into the head of a stored page the worker serves instead of the network's (content: ISO 8601). */
export const SAVED_AT_META = 'tw-saved-at';

/** Store these pages and API answers now (the "Keep for the track" action, or a page just opened). */
export type KeepMessage = { type: 'KEEP'; pages: string[]; api: string[] };
/** The answer to a KEEP message, on the message's port. */
export type KeepResult = { saved: number; failed: string[]; at: string };
/** The member signed out or in: remove everything kept for the previous session. */
export type ForgetPrivateMessage = { type: 'FORGET_PRIVATE' };
/** Used by workbox-window's messageSkipWaiting(): the page asks the waiting worker to take over. */
export type SkipWaitingMessage = { type: 'SKIP_WAITING' };

export type WorkerMessage = KeepMessage | ForgetPrivateMessage | SkipWaitingMessage;

/** API reads the worker never stores: tokens, development tools, documents that change per build. */
export const NOT_STORED_API = [/^\/api\/csrf$/, /^\/api\/dev\//, /^\/api\/health$/, /^\/api\/openapi\.json$/, /^\/api\/docs$/];
