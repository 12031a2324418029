import 'reflect-metadata';
import { DataSource } from 'typeorm';
import { entities } from './entities';
import { migrations } from './migrations/index';

/** A TypeORM data source for the given database URL (migrations only, never synchronize). */
export function createDataSource(url: string, opts: { poolMax?: number; applicationName?: string } = {}) {
  return new DataSource({
    type: 'postgres',
    url,
    entities,
    migrations,
    synchronize: false,
    migrationsRun: false,
    logging: false,
    extra: {
      max: opts.poolMax ?? 10,
      // Fail fast when PostgreSQL is away, so requests answer 503 instead of hanging.
      connectionTimeoutMillis: 3000,
      statement_timeout: 15_000,
      application_name: opts.applicationName ?? 'tunewright',
    },
  });
}
