import type { DataSource } from 'typeorm';
import type { Config } from './config/env';
import type { Logger } from './lib/logger';
import type { Mailer } from './lib/mailer';
import type { DocumentListener } from './lib/document-listener';
import type { Storage } from './lib/storage';
import type { SearchService } from './modules/search/service';

/** What every module needs at run time; built once per process (or per test file). */
export type AppContext = {
  config: Config;
  dataSource: DataSource;
  mailer: Mailer;
  logger: Logger;
  /** LISTENs for committed changes to live documents (caches and the search index subscribe). */
  documentListener: DocumentListener;
  /** Uploaded files (setup records): local disk or S3-compatible storage. */
  storage: Storage;
  search: SearchService;
};
