import { z } from 'zod';

const upOrDown = z.enum(['up', 'down']);

/** `GET /api/health`: whether the database and the object store answer (200 all up, 503 otherwise). */
export const healthOutput = z.object({ ok: z.boolean(), database: upOrDown, storage: upOrDown }).meta({ id: 'Health' });
export type HealthOutput = z.infer<typeof healthOutput>;

/** `GET /api/openapi.json`: the document itself (described by the OpenAPI 3.1 specification, not here). */
export const apiDocumentOutput = z.object({}).passthrough().describe('OpenAPI 3.1 document');
