// The record's reader-facing words live in shared/, so the review screen shows a baseline the same way.
export { classLabel, fmt, showValue, surfaceLabel } from '@shared/setup/show-value';
