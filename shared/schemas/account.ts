import { z } from 'zod';
import { LIMITS } from '../constants';

/** DELETE /api/account: the person proves it is them with their current password. */
export const deleteAccountSchema = z.strictObject({
  currentPassword: z.string({ message: 'Enter your current password' }).min(1, 'Enter your current password').max(LIMITS.passwordMax),
});
export type DeleteAccountInput = z.infer<typeof deleteAccountSchema>;

/** The neutral name published contributions are credited to once their author deleted the account. */
export const FORMER_MEMBER_NAME = 'Former member';
