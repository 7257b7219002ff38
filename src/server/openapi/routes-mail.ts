import type { RouteConfig } from '@asteasolutions/zod-to-openapi';

/** API routes of the mail feature, described from their zod schemas. */
export const mailRoutes: RouteConfig[] = [];
