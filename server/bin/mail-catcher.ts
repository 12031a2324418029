// The local demo's SMTP catcher as its own process (npm start runs it on loopback).
import 'reflect-metadata';
import { createDataSource } from '../db/data-source';
import { startMailCatcher } from '../lib/mail-catcher';

const url = process.env.DATABASE_URL;
const port = Number(process.env.MAIL_CATCHER_PORT ?? 2525);
if (!url) throw new Error('DATABASE_URL is required');
const dataSource = createDataSource(url, { poolMax: 2, applicationName: 'tunewright-mail-catcher' });
await dataSource.initialize();
const catcher = await startMailCatcher({ dataSource, port });
console.log(`[tunewright] mail catcher listening on smtp://127.0.0.1:${catcher.port}`);
const stop = async () => {
  await catcher.close();
  await dataSource.destroy();
  process.exit(0);
};
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
