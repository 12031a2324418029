import { InitialSchema1764633600000 } from './1764633600000-initial-schema';
import { Setups1796166650149 } from './1796166650149-setups';
import { SignInAttempts1796175945183 } from './1796175945183-sign-in-attempts';
import { Runs1796500000000 } from './1796500000000-runs';

/** Migrations in order; listed explicitly so tsx, vitest and the bundler-free CLI all load them the same way. */
export const migrations = [InitialSchema1764633600000, Setups1796166650149, SignInAttempts1796175945183, Runs1796500000000];
