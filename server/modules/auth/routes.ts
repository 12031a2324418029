import { z } from 'zod';
import {
  changePasswordSchema,
  forgotPasswordSchema,
  resetPasswordSchema,
  signInSchema,
  signUpAcceptedSchema,
  signUpSchema,
  updateProfileSchema,
  userSchema,
  verifyEmailSchema,
} from '../../../shared/schemas/user';
import { defineRoute } from '../../lib/route';
import { AppError } from '../../lib/errors';
import { logIn, logOut, sessionCookieName } from '../../middleware/auth';
import { csrf } from '../../middleware/csrf';
import { presentUser } from './presenter';
import { authService } from './service';
import type { AppContext } from '../../context';

const userData = z.object({ user: userSchema });

/** A rate-limited "mail this address" route that answers 202 either way, so it never tells whether an account exists. */
function mailByAddressRoute(path: string, summary: string, send: (ctx: AppContext, email: string) => Promise<void>) {
  return defineRoute({
    method: 'post',
    path,
    summary,
    tags: ['auth'],
    access: 'public',
    rateLimit: 'auth',
    body: forgotPasswordSchema,
    status: 202,
    handler: async ({ body, ctx, res }) => {
      // The work (a token and a mail for an address with an account, nothing for one without) is done
      // after the answer has gone, so neither the answer nor its timing tells the two apart.
      res.once('finish', () => {
        send(ctx, body.email).catch((err: unknown) => ctx.logger.warn({ err }, `${path}: the mail could not be prepared`));
      });
      return { status: 202, data: { sent: true } };
    },
  });
}

export const authRoutes = [
  defineRoute({
    method: 'get',
    path: '/api/csrf',
    summary: 'Get the CSRF token for this session',
    tags: ['auth'],
    access: 'public',
    response: z.object({ token: z.string() }),
    handler: async ({ req }) => {
      const token = csrf.generateToken(req);
      // Store the session before answering, so a POST sent right after the response finds it.
      await new Promise<void>((resolve, reject) => req.session.save((err) => (err ? reject(err) : resolve())));
      return { data: { token } };
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/auth/sign-up',
    summary:
      'Create an account and send the verification mail (answers 202 the same way for an address that already has an account, whose owner is mailed instead)',
    tags: ['auth'],
    access: 'public',
    rateLimit: 'auth',
    body: signUpSchema,
    response: signUpAcceptedSchema,
    status: 202,
    handler: async ({ body, ctx }) => {
      const { email } = await authService(ctx).signUp(body);
      return { status: 202, data: { email, sent: true as const } };
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/auth/verify',
    summary: 'Confirm an e-mail address with the single-use token from the mail; signs the account in (a new session)',
    tags: ['auth'],
    access: 'public',
    rateLimit: 'auth',
    body: verifyEmailSchema,
    response: userData.extend({ signedIn: z.boolean() }),
    // Opening the link proves the mailbox, as a reset link does: the person is signed in and goes on to their workbench.
    handler: async ({ body, req, ctx }) => {
      const verified = await authService(ctx).verifyEmail(body.token);
      const user = presentUser(verified);
      if (!verified.disabledAt) await logIn(req, user);
      return { data: { user, signedIn: !verified.disabledAt } };
    },
  }),
  mailByAddressRoute('/api/auth/resend-verification', 'Send a new verification mail (answers 202 whether or not the account exists)', (ctx, email) =>
    authService(ctx).resendVerification(email),
  ),
  defineRoute({
    method: 'post',
    path: '/api/auth/sign-in',
    summary: 'Sign in with e-mail and password',
    tags: ['auth'],
    access: 'public',
    rateLimit: 'auth',
    body: signInSchema,
    response: userData,
    handler: async ({ body, req, res, ctx }) => {
      const user = presentUser(
        await authService(ctx)
          .authenticate(body.email, body.password)
          .catch((err: unknown) => {
            if (err instanceof AppError && err.code === 'sign_in_throttled')
              res.setHeader('Retry-After', String((err.details as { retryAfterSeconds: number }).retryAfterSeconds));
            throw err;
          }),
      );
      await logIn(req, user);
      return { data: { user } };
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/auth/sign-out',
    summary: 'Sign out and end this session',
    tags: ['auth'],
    access: 'public',
    owner: { resource: 'account', rule: 'self' },
    status: 204,
    handler: async ({ req, res, ctx }) => {
      if (req.session) await logOut(req);
      res.clearCookie(sessionCookieName(ctx.config), { path: '/', httpOnly: true, sameSite: 'lax', secure: ctx.config.production });
      return { status: 204 };
    },
  }),
  defineRoute({
    method: 'get',
    path: '/api/auth/me',
    summary: 'The signed-in account, or null',
    tags: ['auth'],
    access: 'public',
    owner: { resource: 'account', rule: 'self' },
    response: z.object({ user: userSchema.nullable() }),
    handler: ({ user }) => ({ data: { user } }),
  }),
  mailByAddressRoute('/api/auth/forgot-password', 'Mail a password-reset link (answers 202 whether or not the account exists)', (ctx, email) =>
    authService(ctx).forgotPassword(email),
  ),
  defineRoute({
    method: 'post',
    path: '/api/auth/reset-password',
    summary: 'Choose a new password with the single-use token from the mail',
    tags: ['auth'],
    access: 'public',
    rateLimit: 'auth',
    body: resetPasswordSchema,
    response: userData,
    handler: async ({ body, ctx }) => ({ data: { user: presentUser(await authService(ctx).resetPassword(body.token, body.password)) } }),
  }),
  defineRoute({
    method: 'patch',
    path: '/api/account',
    summary: 'Change your display name or display units (metric or imperial)',
    tags: ['account'],
    access: 'member',
    owner: { resource: 'account', rule: 'self' },
    body: updateProfileSchema,
    response: userData,
    handler: async ({ body, user, req, ctx }) => {
      const updated = presentUser(await authService(ctx).updateProfile(user.id, body));
      req.user = updated;
      return { data: { user: updated } };
    },
  }),
  defineRoute({
    method: 'post',
    path: '/api/account/password',
    summary: 'Change your password; ends your other sessions and rotates this one',
    tags: ['account'],
    access: 'member',
    owner: { resource: 'account', rule: 'self' },
    rateLimit: 'auth',
    body: changePasswordSchema,
    response: userData,
    handler: async ({ body, user, req, ctx }) => {
      const updated = presentUser(await authService(ctx).changePassword(user.id, body.currentPassword, body.newPassword));
      await logIn(req, updated);
      return { data: { user: updated } };
    },
  }),
];
