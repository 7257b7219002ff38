import { describe, expect, it } from 'vitest';
import { readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { Validator } from '@seriousme/openapi-schema-validator';
import { ApiClient, BASE } from '../helpers/api-client';
import { assertDocumentedResponse, ContractError } from '../helpers/openapi-contract';

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

describe('every API answer in the tests is held to the document (tests/helpers/openapi-contract.ts)', () => {
  // Invented answers, made here so the check itself is shown to fail where it should.
  const answer = (status: number, body: unknown) =>
    new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json; charset=utf-8' } });
  const health = { ok: true, database: 'up', storage: 'up' };

  it('accepts a documented status with a matching body', async () => {
    await expect(assertDocumentedResponse(BASE(), 'GET', '/api/health', answer(200, health))).resolves.toBeUndefined();
  });

  it('fails an undocumented status, a body off the schema, an undocumented field and an unknown path', async () => {
    await expect(assertDocumentedResponse(BASE(), 'GET', '/api/health', answer(418, health))).rejects.toThrow(ContractError);
    await expect(assertDocumentedResponse(BASE(), 'GET', '/api/health', answer(200, { ...health, database: 'sideways' }))).rejects.toThrow(/does not match/);
    await expect(assertDocumentedResponse(BASE(), 'GET', '/api/health', answer(200, { ...health, extra: 1 }))).rejects.toThrow(/does not match/);
    await expect(assertDocumentedResponse(BASE(), 'GET', '/api/no-such-thing', answer(200, {}))).rejects.toThrow(/no operation/);
    await expect(assertDocumentedResponse(BASE(), 'DELETE', '/api/health', answer(200, health))).rejects.toThrow(/no operation/);
    // …while refusing what is not an operation is right.
    await expect(assertDocumentedResponse(BASE(), 'GET', '/api/no-such-thing', answer(404, {}))).resolves.toBeUndefined();
  });

  it('resolves path templates, static paths and parameters alike', async () => {
    const id = '00000000-0000-4000-8000-000000000000'; // invented id
    const notFound = answer(404, { error: { code: 'not_found', message: 'That class could not be found.' } });
    await expect(assertDocumentedResponse(BASE(), 'GET', `/api/lessons/${id}/timeline?x=1`, notFound)).resolves.toBeUndefined();
    await expect(assertDocumentedResponse(BASE(), 'POST', `/api/lessons/${id}/check`, answer(200, { ok: true }))).rejects.toThrow(/does not match/);
  });
});
