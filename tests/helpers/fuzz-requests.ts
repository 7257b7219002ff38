/**
 * Random and hostile requests for every operation of the OpenAPI document the app serves, built
 * with fast-check. The operation list is read from the document, so a new endpoint is fuzzed as
 * soon as it is documented. Bodies start from values generated out of the documented request
 * schema (json-schema-faker, seeded by fast-check so a seed replays the run), then are mutated
 * with hostile values; raw non-JSON text, random JSON and random query strings are mixed in.
 * Every value here is invented test input.
 */
import fc from 'fast-check';
import { generateSync, type JsonSchema } from 'json-schema-faker';

interface Parameter {
  in: 'path' | 'query' | 'header' | 'cookie';
  name: string;
  schema?: JsonSchema;
}
interface Operation {
  parameters?: Parameter[];
  requestBody?: { content?: Record<string, { schema?: JsonSchema }> };
}
export interface OpenApiDocument {
  paths: Record<string, Record<string, Operation>>;
  components?: unknown;
}

export interface FuzzOperation {
  method: string;
  template: string;
  operation: Operation;
}

export interface FuzzRequest {
  method: string;
  template: string;
  path: string;
  body?: string;
  contentType?: string;
}

const METHODS = new Set(['get', 'put', 'post', 'delete', 'patch']);

export function operationsOf(doc: OpenApiDocument): FuzzOperation[] {
  return Object.entries(doc.paths).flatMap(([template, ops]) =>
    Object.entries(ops)
      .filter(([m]) => METHODS.has(m))
      .map(([method, operation]) => ({ method: method.toUpperCase(), template, operation })),
  );
}

/** Values that broke real APIs before (ours among them: see tests/integration/bad-input.test.ts). */
const HOSTILE_STRINGS = [
  '',
  ' ',
  'abc',
  '-'.repeat(36),
  '0'.repeat(36),
  '00000000-0000-0000-0000-000000000000',
  'Squat\u0000jumps',
  '\u0007\u001b[31m',
  '\ud800',
  'ＡＢＣ\u202e',
  '💪🏽'.repeat(50),
  '<script>alert(1)</script>',
  "' OR 1=1 --",
  '../../etc/passwd',
  '%00',
  '=HYPERLINK("x")',
  '9999-12-31T23:59:59Z',
  '0000-01-01T00:00:00Z',
  '2026-02-30T25:61:61+99:99',
  'NaN',
  'Infinity',
  '1e309',
  '-0',
  'x'.repeat(5_000),
];
const HOSTILE_NUMBERS = [0, -1, -0, 0.5, 1e-300, 3_000_000_000, 2_147_483_648, -2_147_483_649, Number.MAX_SAFE_INTEGER + 2, 1e300, -1e300];

export const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom<unknown>(...HOSTILE_STRINGS, ...HOSTILE_NUMBERS, null, true, false, [], {}, [[[[[]]]]], { __proto__: { admin: true } }),
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.double(),
  fc.integer(),
  fc.jsonValue({ maxDepth: 3 }),
);

/** Raw bodies that are not what a JSON endpoint expects. */
const hostileText = fc.oneof(
  fc.constantFrom('', '{', 'null', '[]', '"x"', '{"a":1,}', '\u0000', '['.repeat(5_000) + ']'.repeat(5_000), `{"title":"${'x'.repeat(70_000)}"}`),
  fc.string({ unit: 'binary', maxLength: 200 }),
);

/** A value from the documented schema: often valid, sometimes only nearly (json-schema-faker's best effort). */
function fromSchema(schema: JsonSchema | undefined, doc: OpenApiDocument, seed: number): unknown {
  if (!schema) return undefined;
  try {
    return generateSync({ ...(schema as object), components: doc.components } as JsonSchema, { seed, optionalsProbability: 0.7, maxItems: 6, maxLength: 60 });
  } catch {
    return {};
  }
}

/** Every place inside a JSON value (the value itself first), as key paths. */
function placesIn(value: unknown, at: (string | number)[] = []): (string | number)[][] {
  const here = [at];
  if (Array.isArray(value)) return here.concat(value.flatMap((v, i) => placesIn(v, [...at, i])));
  if (value && typeof value === 'object') return here.concat(Object.entries(value).flatMap(([k, v]) => placesIn(v, [...at, k])));
  return here;
}

/** The value with the n-th place replaced (or, for an object, a key removed or a stray one added). */
function mutate(value: unknown, n: number, replacement: unknown, how: 'replace' | 'drop' | 'add'): unknown {
  const copy = structuredClone(value);
  const places = placesIn(copy);
  const path = places[n % places.length]!;
  if (path.length === 0) return how === 'replace' ? replacement : copy;
  const parent = path.slice(0, -1).reduce<unknown>((o, k) => (o as Record<string | number, unknown>)[k], copy) as Record<string | number, unknown>;
  const key = path[path.length - 1]!;
  if (how === 'drop' && !Array.isArray(parent)) delete parent[key];
  else if (how === 'add' && !Array.isArray(parent)) parent[`${String(key)}Extra`] = replacement;
  else parent[key] = replacement;
  return copy;
}

function jsonBody(schema: JsonSchema | undefined, doc: OpenApiDocument): fc.Arbitrary<{ body: string; contentType: string }> {
  const asJson = (v: unknown) => ({ body: JSON.stringify(v) ?? 'null', contentType: 'application/json' });
  const seed = fc.integer({ min: 1, max: 2 ** 31 - 1 });
  return fc.oneof(
    { weight: 4, arbitrary: seed.map((s) => asJson(fromSchema(schema, doc, s))) },
    {
      weight: 5,
      arbitrary: fc
        .tuple(seed, fc.nat(), hostileValue, fc.constantFrom<'replace' | 'drop' | 'add'>('replace', 'replace', 'drop', 'add'))
        .map(([s, n, v, how]) => asJson(mutate(fromSchema(schema, doc, s), n, v, how))),
    },
    { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 4 }).map(asJson) },
    { weight: 1, arbitrary: fc.tuple(hostileText, fc.constantFrom('application/json', 'text/plain', 'application/x-www-form-urlencoded')).map(([body, contentType]) => ({ body, contentType })) },
  );
}

/** CSV and WebVTT files: lines of plausible cells and times with hostile ones mixed in. */
function textFileBody(mediaTypes: string[]): fc.Arbitrary<{ body: string; contentType: string }> {
  const cell = fc.oneof(fc.constantFrom('work', 'rest', 'warmup', 'cue', '0', '12.5', '00:00:04.000', '-->', '"', '""', ''), fc.string({ maxLength: 12 }), hostileValue.map(String));
  const line = fc.tuple(fc.array(cell, { maxLength: 8 }), fc.constantFrom(',', ' --> ', '\t')).map(([cells, separator]) => cells.join(separator));
  const file = fc.tuple(fc.constantFrom('kind,start,end,exercise,set,text\n', 'WEBVTT\n\n', '\ufeffWEBVTT\n\n', ''), fc.array(line, { maxLength: 30 })).map(([head, lines]) => head + lines.join('\n'));
  return fc.tuple(fc.oneof(file, hostileText), fc.constantFrom(...mediaTypes, 'application/json')).map(([body, contentType]) => ({ body, contentType }));
}

/**
 * Route ids: mostly ones that exist (ours and another studio's), else random UUIDs and hostile
 * text. Never empty: `/api/lessons/` is the list route with a trailing slash, not a bad id.
 */
export type IdPool = (template: string, name: string) => string[];

function pathValue(ids: string[]): fc.Arbitrary<string> {
  const known = ids.length ? [{ weight: 6, arbitrary: fc.constantFrom(...ids) }] : [];
  return fc.oneof(...known, { weight: 1, arbitrary: fc.uuid() }, { weight: 2, arbitrary: fc.constantFrom(...HOSTILE_STRINGS.filter((s) => s.trim() !== '' && s.length < 200)) }, { weight: 1, arbitrary: fc.string({ minLength: 1, maxLength: 40 }) });
}

function queryString(params: Parameter[], doc: OpenApiDocument): fc.Arbitrary<string> {
  const documented = params.map((p) =>
    fc.option(
      fc.oneof(
        fc.integer({ min: 1, max: 2 ** 31 - 1 }).map((s) => fromSchema(p.schema, doc, s)),
        hostileValue,
      ).map((v) => [p.name, typeof v === 'string' ? v : JSON.stringify(v) ?? ''] as [string, string]),
      { freq: 2 },
    ),
  );
  const stray = fc.option(fc.tuple(fc.string({ maxLength: 10 }), hostileValue.map((v) => (typeof v === 'string' ? v : JSON.stringify(v) ?? ''))), { freq: 4 });
  return fc.tuple(fc.tuple(...documented), stray).map(([pairs, extra]) => {
    const q = new URLSearchParams();
    for (const p of [...pairs, extra]) if (p) q.append(p[0], p[1]);
    const s = q.toString();
    return s ? `?${s}` : '';
  });
}

/** One arbitrary request for one operation. */
export function requestFor(op: FuzzOperation, doc: OpenApiDocument, ids: IdPool): fc.Arbitrary<FuzzRequest> {
  const params = op.operation.parameters ?? [];
  const pathParams = params.filter((p) => p.in === 'path');
  const pathArb = fc.tuple(...pathParams.map((p) => pathValue(ids(op.template, p.name)))).map((values) =>
    pathParams.reduce((path, p, i) => path.replace(`{${p.name}}`, encodeURIComponent(values[i]!.toWellFormed())), op.template),
  );
  const content = op.operation.requestBody?.content ?? {};
  const mediaTypes = Object.keys(content);
  const bodyArb: fc.Arbitrary<{ body: string; contentType: string } | undefined> = mediaTypes.includes('application/json')
    ? jsonBody(content['application/json']!.schema, doc)
    : mediaTypes.length
      ? textFileBody(mediaTypes)
      : fc.option(fc.oneof(fc.jsonValue({ maxDepth: 3 }).map((v) => ({ body: JSON.stringify(v) ?? 'null', contentType: 'application/json' })), hostileText.map((body) => ({ body, contentType: 'text/plain' }))), { freq: 5, nil: undefined });
  // fetch sends no body with GET (and neither do browsers).
  return fc.tuple(pathArb, queryString(params.filter((p) => p.in === 'query'), doc), op.method === 'GET' ? fc.constant(undefined) : bodyArb).map(([path, query, body]) => ({
    method: op.method,
    template: op.template,
    path: path + query,
    ...(body ?? {}),
  }));
}

/** Requests over every operation, each operation equally likely. */
export function anyRequest(doc: OpenApiDocument, ids: IdPool): fc.Arbitrary<FuzzRequest> {
  return fc.oneof(...operationsOf(doc).map((op) => requestFor(op, doc, ids)));
}
