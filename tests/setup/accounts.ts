import crypto from 'node:crypto';
import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/constants';
import { hashPassword } from '../../server/lib/passwords';
import { UserEntity } from '../../server/modules/auth/user.entity';

export const ACCOUNT_PASSWORD = 'tidal-gearbox-lantern-42';

/**
 * Verified accounts written straight into a database (for apps running in other processes, where the
 * TestApp factories do not reach). Cost-4 hashes: sign-in checks the hash at its own cost.
 */
export async function insertAccounts(ds: DataSource, role: Role, count: number, label: string = role) {
  const repo = ds.getRepository(UserEntity);
  const passwordHash = await hashPassword(ACCOUNT_PASSWORD, 4);
  const out: Array<{ id: string; email: string; password: string }> = [];
  for (let i = 0; i < count; i++) {
    const n = crypto.randomBytes(3).toString('hex');
    const user = await repo.save(
      repo.create({ email: `${label}-${i}-${n}@tidewater.test`, displayName: `Tidewater ${label} ${i}`, role, passwordHash, emailVerifiedAt: new Date() }),
    );
    out.push({ id: user.id, email: user.email, password: ACCOUNT_PASSWORD });
  }
  return out;
}
