import { IsNull, MoreThan, type DataSource, type EntityManager } from 'typeorm';
import { paths } from '../../../shared/paths';
import { LIMITS } from '../../../shared/constants';
import type { SignUpInput, UpdateProfileInput } from '../../../shared/schemas/user';
import { AppError, validationFailed } from '../../lib/errors';
import { hashPassword, passwordWeakness, verifyPassword } from '../../lib/passwords';
import { hashToken, newToken } from '../../lib/tokens';
import type { AppContext } from '../../context';
import { UserEntity } from './user.entity';
import { UserTokenEntity, type TokenPurpose } from './user-token.entity';
import { alreadyRegisteredMail, passwordChangedMail, resetMail, verificationMail } from './mail';
import { signInThrottle } from './sign-in-throttle';

// Compared against when the e-mail is unknown, so both failures take the same time.
const dummyHashes = new Map<number, Promise<string>>();
function dummyHash(cost: number) {
  if (!dummyHashes.has(cost)) dummyHashes.set(cost, hashPassword('not-a-real-password-for-timing', cost));
  return dummyHashes.get(cost)!;
}

function assertStrong(password: string, inputs: string[]) {
  const weakness = passwordWeakness(password, inputs);
  if (weakness) throw validationFailed([{ path: 'body.password', message: weakness }], weakness);
}

async function issueToken(m: EntityManager, userId: string, purpose: TokenPurpose, ttlMs: number) {
  const repo = m.getRepository(UserTokenEntity);
  // A new link replaces older unused ones of the same purpose.
  await repo.update({ userId, purpose, usedAt: IsNull() }, { usedAt: new Date() });
  const { token, hash } = newToken();
  await repo.insert({ userId, purpose, tokenHash: hash, expiresAt: new Date(Date.now() + ttlMs) });
  return token;
}

async function consumeToken(m: EntityManager, token: string, purpose: TokenPurpose) {
  const repo = m.getRepository(UserTokenEntity);
  const row = await repo
    .createQueryBuilder('t')
    .where('t.tokenHash = :hash AND t.purpose = :purpose', { hash: hashToken(token), purpose })
    .setLock('pessimistic_write')
    .getOne();
  if (!row || row.usedAt || row.expiresAt.getTime() < Date.now()) {
    throw new AppError(400, 'token_invalid', 'That link is not valid any more. Ask for a new one.');
  }
  row.usedAt = new Date();
  await repo.save(row);
  return row;
}

export function authService(ctx: AppContext) {
  const ds: DataSource = ctx.dataSource;
  const users = () => ds.getRepository(UserEntity);
  const throttle = (db: DataSource | EntityManager = ds) => signInThrottle(db, ctx.config.rateLimits.signInPerAccountPer15Min);

  return {
    async signUp(input: SignUpInput) {
      assertStrong(input.password, [input.email, input.displayName, 'tunewright']);
      const passwordHash = await hashPassword(input.password, ctx.config.bcryptCost);
      return ds.transaction(async (m) => {
        const existing = await m.getRepository(UserEntity).findOne({ where: { email: input.email } });
        if (existing) {
          // The same answer as a new sign-up, so the form never tells whether an address has an account;
          // the address's owner learns of the attempt instead.
          await ctx.mailer.send(alreadyRegisteredMail(existing.email, ctx.config.appUrl), m);
          return { email: input.email };
        }
        const user = m.getRepository(UserEntity).create({ email: input.email, displayName: input.displayName, passwordHash, role: 'member' });
        await m.getRepository(UserEntity).save(user);
        const token = await issueToken(m, user.id, 'verify_email', LIMITS.verifyTokenHours * 3600_000);
        await ctx.mailer.send(verificationMail(user.email, `${ctx.config.appUrl}${paths.verify(token)}`), m);
        return { email: user.email };
      });
    },

    async verifyEmail(token: string) {
      return ds.transaction(async (m) => {
        const row = await consumeToken(m, token, 'verify_email');
        const user = await m.getRepository(UserEntity).findOneByOrFail({ id: row.userId });
        if (!user.emailVerifiedAt) {
          user.emailVerifiedAt = new Date();
          await m.getRepository(UserEntity).save(user);
        }
        return user;
      });
    },

    /**
     * Checks credentials; the same answer for an unknown e-mail and a wrong password. A disabled account
     * is told so (403 account_disabled) only after the right password: to anyone else it answers like
     * any wrong password, so the state of an account is not disclosed.
     */
    async authenticate(email: string, password: string) {
      // Counted before the password is checked, for every address alike (see sign-in-throttle.ts).
      await throttle().reserve(email);
      const user = await users().findOne({ where: { email } });
      const ok = await verifyPassword(password, user?.passwordHash ?? (await dummyHash(ctx.config.bcryptCost)));
      if (!user || !ok) throw new AppError(401, 'invalid_credentials', 'That e-mail and password do not match an account.');
      await throttle().clear(email);
      if (user.disabledAt)
        throw new AppError(
          403,
          'account_disabled',
          'This account is disabled, so it cannot sign in. If you think this is a mistake, write to the site administrators.',
        );
      if (!user.emailVerifiedAt)
        throw new AppError(403, 'email_unverified', 'Confirm your e-mail address first: open the link we sent you, or ask for a new one.');
      return user;
    },

    async resendVerification(email: string) {
      await ds.transaction(async (m) => {
        const user = await m.getRepository(UserEntity).findOne({ where: { email } });
        if (!user || user.emailVerifiedAt || user.disabledAt) return;
        const token = await issueToken(m, user.id, 'verify_email', LIMITS.verifyTokenHours * 3600_000);
        await ctx.mailer.send(verificationMail(user.email, `${ctx.config.appUrl}${paths.verify(token)}`), m);
      });
    },

    /** Always succeeds from the caller's view, so it never tells whether an account exists. */
    async forgotPassword(email: string) {
      await ds.transaction(async (m) => {
        const user = await m.getRepository(UserEntity).findOne({ where: { email } });
        if (!user || user.disabledAt) return;
        const token = await issueToken(m, user.id, 'reset_password', LIMITS.resetTokenMinutes * 60_000);
        await ctx.mailer.send(resetMail(user.email, `${ctx.config.appUrl}${paths.resetPassword(token)}`), m);
      });
    },

    async resetPassword(token: string, password: string) {
      const tokenRow = await ds
        .getRepository(UserTokenEntity)
        .findOne({ where: { tokenHash: hashToken(token), purpose: 'reset_password', usedAt: IsNull(), expiresAt: MoreThan(new Date()) } });
      const owner = tokenRow ? await users().findOneBy({ id: tokenRow.userId }) : null;
      if (owner) assertStrong(password, [owner.email, owner.displayName]);
      const passwordHash = await hashPassword(password, ctx.config.bcryptCost);
      return ds.transaction(async (m) => {
        const row = await consumeToken(m, token, 'reset_password');
        const user = await m.getRepository(UserEntity).findOneByOrFail({ id: row.userId });
        user.passwordHash = passwordHash;
        // Following the link proves the mailbox, so the address counts as verified.
        user.emailVerifiedAt ??= new Date();
        await m.getRepository(UserEntity).save(user);
        await endSessions(m, user.id);
        // The mailbox is proven: a member locked out by someone guessing at their address gets straight back in.
        await throttle(m).clear(user.email);
        await ctx.mailer.send(passwordChangedMail(user.email, { at: new Date(), via: 'reset', appUrl: ctx.config.appUrl }), m);
        return user;
      });
    },

    async changePassword(userId: string, currentPassword: string, newPassword: string) {
      const user = await users().findOneByOrFail({ id: userId });
      if (!(await verifyPassword(currentPassword, user.passwordHash))) {
        throw validationFailed([{ path: 'body.currentPassword', message: 'That is not your current password' }], 'That is not your current password');
      }
      assertStrong(newPassword, [user.email, user.displayName]);
      user.passwordHash = await hashPassword(newPassword, ctx.config.bcryptCost);
      await ds.transaction(async (m) => {
        await m.getRepository(UserEntity).save(user);
        await endSessions(m, user.id);
        await ctx.mailer.send(passwordChangedMail(user.email, { at: new Date(), via: 'account', appUrl: ctx.config.appUrl }), m);
      });
      return user;
    },

    async updateProfile(userId: string, changes: UpdateProfileInput) {
      const user = await users().findOneByOrFail({ id: userId });
      if (changes.displayName !== undefined) user.displayName = changes.displayName;
      if (changes.units !== undefined) user.units = changes.units;
      return users().save(user);
    },

    findById: (id: string) => users().findOneBy({ id }),
  };
}

/** Ends every stored session of an account (disable, password change). */
export async function endSessions(m: EntityManager, userId: string) {
  await m.query(`DELETE FROM session WHERE (sess -> 'passport' ->> 'user') = $1`, [userId]);
}
