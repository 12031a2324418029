import type { DataSource } from 'typeorm';
import { UserEntity } from '../modules/auth/user.entity';
import { hashPassword } from '../lib/passwords';
import { DEMO_ACCOUNTS } from './demo-accounts';
import { seedDemoMotor } from '../modules/motors/demo';
import { seedGuideBaselines, seedGuides, seedParameters } from './seed-content';
import type { Storage } from '../lib/storage';
import type { Logger } from '../lib/logger';
import { seedDemoRuns } from '../modules/runs/demo-seed';

export type SeedOptions = {
  demo: boolean;
  bcryptCost: number;
  log?: (msg: string) => void;
  /** Where the demo guides' invented runs are stored; without it no demo runs are made. */
  runs?: { storage: Storage; logger: Logger };
};

/** Seeds the demo accounts idempotently (by e-mail); existing rows are left as they are. */
export async function seedDemoAccounts(ds: DataSource, bcryptCost: number) {
  const repo = ds.getRepository(UserEntity);
  const byKey = new Map<string, UserEntity>();
  for (const a of DEMO_ACCOUNTS) {
    let user = await repo.findOneBy({ email: a.email });
    if (!user) {
      user = await repo.save(
        repo.create({
          email: a.email,
          displayName: a.displayName,
          role: a.role,
          passwordHash: await hashPassword(a.password, bcryptCost),
          emailVerifiedAt: new Date(),
        }),
      );
    }
    byKey.set(a.key, user);
  }
  return byKey;
}

/** Seeds everything the app needs; each step is idempotent, keyed by slug or e-mail. */
export async function seed(ds: DataSource, opts: SeedOptions) {
  const log = opts.log ?? (() => {});
  const parameters = await seedParameters(ds);
  log(`parameter library ready (${parameters} new entries)`);
  if (opts.demo) {
    const users = await seedDemoAccounts(ds, opts.bcryptCost);
    log(`demo accounts ready (${DEMO_ACCOUNTS.length})`);
    const reviewers = [...users.values()].filter((u) => u.role === 'moderator');
    const guides = await seedGuides(ds, users, reviewers);
    log(`demo guides ready (${guides} new)`);
    const baselines = await seedGuideBaselines(ds);
    log(`guide baselines ready (${baselines} attached)`);
    const benchChecks = await seedDemoMotor(ds, users.get('rosa'));
    log(`demo motor bench ready (${benchChecks} new checks)`);
    if (opts.runs) log(`demo runs ready (${await seedDemoRuns(ds, opts.runs.storage, opts.runs.logger)} new, invented by the simulator)`);
  }
}
