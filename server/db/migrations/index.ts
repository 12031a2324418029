import { InitialSchema1764633600000 } from './1764633600000-initial-schema';
import { Setups1796166650149 } from './1796166650149-setups';
import { SignInAttempts1796175945183 } from './1796175945183-sign-in-attempts';
import { ReviewApprovals1796190000000 } from './1796190000000-review-approvals';

import { Motors1796408207857 } from './1796408207857-motors';
import { Runs1796500000000 } from './1796500000000-runs';
import { Images1796600000000 } from './1796600000000-images';
import { RunMotor1796600000014 } from './1796600000014-run-motor';
import { Watches1796700000000 } from './1796700000000-watches';
import { AccountDeletionAndReturns1797200000001 } from './1797200000001-account-deletion-and-returns';
import { UserUnits1797300000001 } from './1797300000001-user-units';
import { AuditOrder1797400000001 } from './1797400000001-audit-order';

/** Migrations in order; listed explicitly so tsx, vitest and the bundler-free CLI all load them the same way. */
export const migrations = [
  InitialSchema1764633600000,
  Setups1796166650149,
  SignInAttempts1796175945183,
  ReviewApprovals1796190000000,
  Motors1796408207857,
  Runs1796500000000,
  Images1796600000000,
  RunMotor1796600000014,
  Watches1796700000000,
  AccountDeletionAndReturns1797200000001,
  UserUnits1797300000001,
  AuditOrder1797400000001,
];
