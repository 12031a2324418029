import crypto from 'node:crypto';
import type { Role } from '../../shared/constants';
import { hashPassword } from '../../server/lib/passwords';
import { UserEntity } from '../../server/modules/auth/user.entity';
import type { TestApp, TestClient } from '../setup/test-app';
import { createClient } from '../setup/test-app';

export const STRONG_PASSWORD = 'tidal-gearbox-lantern-42';

/** Inserts a verified account directly (fast path for tests that are not about sign-up). */
export async function createUser(
  t: TestApp,
  overrides: Partial<{ email: string; displayName: string; role: Role; password: string; verified: boolean; disabled: boolean }> = {},
) {
  const n = crypto.randomBytes(4).toString('hex');
  const password = overrides.password ?? STRONG_PASSWORD;
  const repo = t.db.dataSource.getRepository(UserEntity);
  const user = await repo.save(
    repo.create({
      email: overrides.email ?? `racer-${n}@tidewater.test`,
      displayName: overrides.displayName ?? `Racer ${n}`,
      role: overrides.role ?? 'member',
      passwordHash: await hashPassword(password, 4),
      emailVerifiedAt: overrides.verified === false ? null : new Date(),
      disabledAt: overrides.disabled ? new Date() : null,
    }),
  );
  return { user, password };
}

/** A signed-in client for a new account of the given role. */
export async function signedInClient(t: TestApp, role: Role = 'member'): Promise<{ client: TestClient; user: UserEntity }> {
  const { user, password } = await createUser(t, { role });
  const client = createClient(t.app);
  const res = await client.post('/api/auth/sign-in', { email: user.email, password });
  if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`);
  client.resetCsrf();
  return { client, user };
}
