import { z } from 'zod';
import { LIMITS, ROLES } from '../constants';
import { unitSystemSchema } from '../units';

export const roleSchema = z.enum(ROLES);

/** The public shape of an account. */
export const userSchema = z.object({
  id: z.uuid(),
  email: z.string(),
  displayName: z.string(),
  role: roleSchema,
  emailVerified: z.boolean(),
  /** Display units (#17). */
  units: unitSystemSchema,
});
export type User = z.infer<typeof userSchema>;

/** What administrators see of an account. */
export const adminUserSchema = userSchema.extend({
  disabled: z.boolean(),
  createdAt: z.string(),
});
export type AdminUser = z.infer<typeof adminUserSchema>;

export const emailSchema = z
  .string({ message: 'Enter your e-mail address' })
  .trim()
  .toLowerCase()
  .max(LIMITS.emailMax, 'That e-mail address is too long')
  .pipe(z.email({ message: 'Enter a valid e-mail address' }));

export const displayNameSchema = z
  .string({ message: 'Enter a display name' })
  .trim()
  .min(2, 'Use at least 2 characters')
  .max(LIMITS.displayNameMax, `Use at most ${LIMITS.displayNameMax} characters`);

/** Length rules only; the strength check (common passwords) runs on the server. */
export const passwordSchema = z
  .string({ message: 'Enter a password' })
  .min(LIMITS.passwordMin, `Use at least ${LIMITS.passwordMin} characters`)
  .max(LIMITS.passwordMax, `Use at most ${LIMITS.passwordMax} characters`);

export const signUpSchema = z.object({ email: emailSchema, displayName: displayNameSchema, password: passwordSchema });
export type SignUpInput = z.infer<typeof signUpSchema>;
/** Sign-up's answer: the same for a new address and one that already has an account (which is mailed instead). */
export const signUpAcceptedSchema = z.object({ email: z.string(), sent: z.literal(true) });
export type SignUpAccepted = z.infer<typeof signUpAcceptedSchema>;

export const signInSchema = z.object({
  email: emailSchema,
  password: z.string({ message: 'Enter your password' }).min(1, 'Enter your password').max(LIMITS.passwordMax),
});
export type SignInInput = z.infer<typeof signInSchema>;

export const tokenSchema = z.string({ message: 'The link is missing its token' }).min(20, 'That link is not valid').max(200, 'That link is not valid');
export const verifyEmailSchema = z.object({ token: tokenSchema });
export const forgotPasswordSchema = z.object({ email: emailSchema });
export const resetPasswordSchema = z.object({ token: tokenSchema, password: passwordSchema });
export const changePasswordSchema = z.object({
  currentPassword: z.string().min(1, 'Enter your current password').max(LIMITS.passwordMax),
  newPassword: passwordSchema,
});
/** PATCH /api/account: any of the display name and the display units, at least one. */
export const updateProfileSchema = z
  .object({ displayName: displayNameSchema.optional(), units: unitSystemSchema.optional() })
  .refine((v) => v.displayName !== undefined || v.units !== undefined, { message: 'Send a display name or units' });
export type UpdateProfileInput = z.infer<typeof updateProfileSchema>;

export const adminUserQuerySchema = z.object({
  q: z.string().trim().max(100).optional(),
  role: roleSchema.optional(),
  page: z.coerce.number().int().min(1).max(10_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});
/** Why an administrator changes a role or disables an account: kept in the audit log. */
export const adminReasonSchema = z
  .string({ message: 'Give a reason' })
  .trim()
  .min(5, 'Give a reason (at least 5 characters): it is kept in the audit log')
  .max(500, 'Use at most 500 characters');

export const adminUserPatchSchema = z
  .object({ role: roleSchema.optional(), disabled: z.boolean().optional(), reason: adminReasonSchema.optional() })
  .refine((v) => v.role !== undefined || v.disabled !== undefined, { message: 'Send a role or disabled' })
  // Enabling an account again needs no reason; every other change does.
  .refine((v) => v.reason !== undefined || (v.role === undefined && v.disabled !== true), {
    message: 'Give a reason for a role change or for disabling an account: it is kept in the audit log',
    path: ['reason'],
  });
