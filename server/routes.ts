import type { RouteDef } from './lib/route';
import { authRoutes } from './modules/auth/routes';
import { adminRoutes } from './modules/admin/routes';
import { healthRoutes } from './modules/health/routes';
import { devMailRoutes } from './modules/dev-mail/routes';
import { searchRoutes } from './modules/search/routes';
import { parameterRoutes } from './modules/parameters/routes';
import { calcRoutes } from './modules/calc/routes';
import { setupRoutes } from './modules/setups/routes';
import { guideRoutes } from './modules/guides/routes';
import { revisionRoutes } from './modules/revisions/routes';
import { motorRoutes } from './modules/motors/routes';
import { runRoutes } from './modules/runs/routes';
import { imageRoutes } from './modules/images/routes';
import { watchRoutes } from './modules/watches/routes';
import { changeRoutes } from './modules/changes/routes';
import { auditRoutes } from './modules/audit/routes';
import { accountRoutes } from './modules/account/routes';

/** The route table: every API route, declared once. Validation, OpenAPI and the generated tests read it. */
export const routeTable: RouteDef[] = [
  ...healthRoutes,
  ...authRoutes,
  ...adminRoutes,
  ...devMailRoutes,
  ...guideRoutes,
  ...revisionRoutes,
  ...setupRoutes,
  ...parameterRoutes,
  ...calcRoutes,
  ...searchRoutes,
  ...motorRoutes,
  ...runRoutes,
  ...imageRoutes,
  ...watchRoutes,
  ...changeRoutes,
  ...auditRoutes,
  ...accountRoutes,
];
