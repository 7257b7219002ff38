import { describe, expect, it } from 'vitest';
import { readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { Validator } from '@seriousme/openapi-schema-validator';
import { ApiClient } from '../helpers/api-client';

/** Every endpoint file under src/pages/api as an OpenAPI path ("[id]" -> "{id}"). */
function endpointPaths(dir = 'src/pages/api'): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = join(dir, name);
    if (statSync(full).isDirectory()) return endpointPaths(full);
    const route = '/' + relative('src/pages', full).replace(/\.ts$/, '').replace(/\/index$/, '');
    return [route.replace(/\[(\w+)\]/g, '{$1}')];
  });
}

describe('GET /api/openapi.json', () => {
  it('is a valid OpenAPI 3.1 document (reference validator: @seriousme/openapi-schema-validator, which checks against the official OpenAPI 3.1 JSON Schema)', async () => {
    const res = await new ApiClient().get('/api/openapi.json');
    expect(res.status).toBe(200);
    const doc = await res.json();
    expect(doc.openapi).toBe('3.1.0');
    const result = await new Validator().validate(doc);
    expect(result.errors ?? []).toEqual([]);
    expect(result.valid).toBe(true);
  });

  it('covers every endpoint file under src/pages/api', async () => {
    const doc = await (await new ApiClient().get('/api/openapi.json')).json();
    const documented = Object.keys(doc.paths);
    for (const path of endpointPaths()) expect(documented, `${path} is not documented`).toContain(path);
  });
});
