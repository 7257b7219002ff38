import type { RouteConfig } from '@asteasolutions/zod-to-openapi';

/** Routes added by later features register here, so the document stays complete. */
export const apiRoutes: RouteConfig[] = [];
