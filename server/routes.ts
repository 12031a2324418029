import type { RouteDef } from './lib/route';
import { authRoutes } from './modules/auth/routes';
import { adminRoutes } from './modules/admin/routes';
import { healthRoutes } from './modules/health/routes';
import { devMailRoutes } from './modules/dev-mail/routes';
import { searchRoutes } from './modules/search/routes';

/** The route table: every API route, declared once. Validation, OpenAPI and the generated tests read it. */
export const routeTable: RouteDef[] = [...healthRoutes, ...authRoutes, ...adminRoutes, ...devMailRoutes, ...searchRoutes];
