// `npm run user:create -- --email a@b.test --password '…' --role admin [--name "Display Name"]`
// Creates a verified account (or updates the role and password of an existing one) in the running database.
import 'reflect-metadata';
import fs from 'node:fs';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { z } from 'zod';
import { roleSchema, emailSchema, passwordSchema } from '../../shared/schemas/user';
import { createDataSource } from '../db/data-source';
import { UserEntity } from '../modules/auth/user.entity';
import { hashPassword, passwordWeakness } from '../lib/passwords';

const { values } = parseArgs({
  options: { email: { type: 'string' }, password: { type: 'string' }, role: { type: 'string', default: 'member' }, name: { type: 'string' } },
});
const input = z.object({ email: emailSchema, password: passwordSchema, role: roleSchema }).safeParse(values);
if (!input.success) {
  for (const i of input.error.issues) console.error(`--${i.path.join('.')}: ${i.message}`);
  process.exit(2);
}
const weakness = passwordWeakness(input.data.password, [input.data.email]);
if (weakness) {
  console.error(`--password: ${weakness}`);
  process.exit(2);
}
const runtime = path.resolve('.data', 'runtime.json');
const url = process.env.DATABASE_URL ?? (fs.existsSync(runtime) ? JSON.parse(fs.readFileSync(runtime, 'utf8')).DATABASE_URL : undefined);
if (!url) {
  console.error('No database: set DATABASE_URL, or run `npm start` first (it records the local database in .data/runtime.json).');
  process.exit(2);
}
const ds = createDataSource(url, { poolMax: 1, applicationName: 'tunewright-user-create' });
await ds.initialize();
const repo = ds.getRepository(UserEntity);
const cost = Number(process.env.BCRYPT_COST ?? 12);
const passwordHash = await hashPassword(input.data.password, cost);
let user = await repo.findOneBy({ email: input.data.email });
if (user) {
  user.role = input.data.role;
  user.passwordHash = passwordHash;
  user.emailVerifiedAt ??= new Date();
  user.disabledAt = null;
} else {
  user = repo.create({
    email: input.data.email,
    displayName: values.name ?? input.data.email.split('@')[0],
    role: input.data.role,
    passwordHash,
    emailVerifiedAt: new Date(),
  });
}
await repo.save(user);
console.log(`${user.email} is a verified ${user.role}.`);
await ds.destroy();
