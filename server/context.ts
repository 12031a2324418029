import type { DataSource } from 'typeorm';
import type { Config } from './config/env';
import type { Logger } from './lib/logger';
import type { Mailer } from './lib/mailer';
import type { SearchService } from './modules/search/service';

/** What every module needs at run time; built once per process (or per test file). */
export type AppContext = {
  config: Config;
  dataSource: DataSource;
  mailer: Mailer;
  logger: Logger;
  search: SearchService;
};
