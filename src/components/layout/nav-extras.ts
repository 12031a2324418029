import type { ComponentType } from 'react';

/**
 * Slots the header leaves for features that arrive later (the search box, the review-queue count).
 * Pages in src/app register them, so the layout does not import features directly.
 */
export const navExtras: { SearchBox?: ComponentType; ReviewBadge?: ComponentType } = {};
