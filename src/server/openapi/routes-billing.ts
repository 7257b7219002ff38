import type { RouteConfig } from '@asteasolutions/zod-to-openapi';

/** API routes of the billing feature, described from their zod schemas. */
export const billingRoutes: RouteConfig[] = [];
