import bcrypt from 'bcryptjs';
import { ZxcvbnFactory } from '@zxcvbn-ts/core';
import * as common from '@zxcvbn-ts/language-common';
import * as en from '@zxcvbn-ts/language-en';

let estimator: ZxcvbnFactory | null = null;
function getEstimator() {
  estimator ??= new ZxcvbnFactory({
    dictionary: { ...common.dictionary, ...en.dictionary },
    graphs: common.adjacencyGraphs,
    translations: en.translations,
  });
  return estimator;
}

/**
 * Refuses guessable passwords (common ones, keyboard walks, ones built from the user's own
 * e-mail or name). Returns a human message, or null when the password is acceptable.
 */
export function passwordWeakness(password: string, userInputs: string[] = []): string | null {
  const result = getEstimator().check(password, userInputs.filter(Boolean));
  if (result.score >= 3) return null;
  const hint = result.feedback.warning || result.feedback.suggestions[0];
  return `That password is too easy to guess${hint ? ` (${hint.replace(/\.$/, '').toLowerCase()})` : ''}. A few unrelated words make a strong one.`;
}

export const hashPassword = (password: string, cost: number) => bcrypt.hash(password, cost);
export const verifyPassword = (password: string, hash: string) => bcrypt.compare(password, hash);
