/**
 * Holds every answer the tests get from our API to the OpenAPI document the app serves at
 * /api/openapi.json (generated from the same zod schemas the endpoints use). An answer fails
 * the test when its path has no operation, its status is not documented for that operation,
 * or its JSON body does not match the documented schema.
 *
 * The document is OpenAPI 3.1, whose schemas are JSON Schema 2020-12: validated with Ajv's
 * 2020 draft class and ajv-formats (the well-known JSON Schema validator and its format
 * plug-in), not by hand.
 */
import Ajv2020, { type ValidateFunction } from 'ajv/dist/2020.js';
import addFormats from 'ajv-formats';

interface Operation {
  responses?: Record<string, { content?: Record<string, { schema?: unknown }> }>;
}
interface Document {
  paths: Record<string, Record<string, Operation>>;
}

const DOC_ID = 'https://roundmark.invalid/openapi.json';
const METHODS = new Set(['get', 'put', 'post', 'delete', 'patch', 'head', 'options']);

/** Thrown for an answer that the document does not describe. */
export class ContractError extends Error {
  override name = 'ContractError';
}

interface Contract {
  ajv: InstanceType<typeof Ajv2020>;
  doc: Document;
  /** Path templates, static ones first, each with its matcher. */
  templates: { template: string; pattern: RegExp }[];
  validators: Map<string, ValidateFunction>;
}

let contract: Promise<Contract> | null = null;

function escapePointer(part: string) {
  return part.replace(/~/g, '~0').replace(/\//g, '~1');
}

/** "/api/lessons/{id}/plan" -> a RegExp matching one path segment per parameter. */
function templatePattern(template: string): RegExp {
  const source = template
    .split(/(\{[^}]+\})/)
    .map((part) => (part.startsWith('{') ? '[^/]+' : part.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')))
    .join('');
  return new RegExp(`^${source}$`);
}

/**
 * zod's objects drop unknown keys on input, so the generated schemas leave objects open. An
 * answer, though, should carry only documented fields: every object schema that says nothing
 * about extra properties is closed here (`unevaluatedProperties: false`, JSON Schema 2020-12),
 * so an undocumented field fails too. Objects that allow extras (`.passthrough()`) stay open.
 */
function closeObjects(node: unknown, inAllOf = false): void {
  if (Array.isArray(node)) {
    for (const n of node) closeObjects(n, inAllOf);
    return;
  }
  if (!node || typeof node !== 'object') return;
  const schema = node as Record<string, unknown>;
  const open = 'additionalProperties' in schema || 'unevaluatedProperties' in schema;
  if ((schema.properties || schema.allOf) && !open && !inAllOf) schema.unevaluatedProperties = false;
  for (const [key, value] of Object.entries(schema)) {
    if (key === 'allOf') closeObjects(value, true);
    else if (key === 'properties' || key === '$defs' || key === 'schemas') for (const v of Object.values(value as object)) closeObjects(v);
    else if (key !== 'enum' && key !== 'const' && key !== 'example' && key !== 'default') closeObjects(value);
  }
}

async function load(baseUrl: string): Promise<Contract> {
  const res = await fetch(`${baseUrl}/api/openapi.json`);
  if (res.status !== 200) throw new Error(`GET /api/openapi.json answered ${res.status}`);
  const doc = (await res.json()) as Document & { components?: unknown };
  closeObjects(doc.components);
  for (const ops of Object.values(doc.paths)) for (const op of Object.values(ops)) for (const r of Object.values(op.responses ?? {})) closeObjects(r.content);
  // strict: false because the document carries OpenAPI's own keywords (openapi, paths, …) around the schemas.
  const ajv = new Ajv2020({ strict: false, allErrors: true });
  addFormats(ajv);
  ajv.addSchema({ ...doc, $id: DOC_ID });
  const templates = Object.keys(doc.paths)
    .map((template) => ({ template, pattern: templatePattern(template), params: (template.match(/\{/g) ?? []).length }))
    // A static segment wins over a parameter ("/api/lessons/new" before "/api/lessons/{id}").
    .sort((a, b) => a.params - b.params)
    .map(({ template, pattern }) => ({ template, pattern }));
  return { ajv, doc, templates, validators: new Map() };
}

/** The document (fetched once per test process from the app under test). */
export function loadContract(baseUrl: string): Promise<Contract> {
  contract ??= load(baseUrl).catch((e) => {
    contract = null;
    throw e;
  });
  return contract;
}

/** The operation a request reached: its path template, or a failure when none matches. */
export function findOperation(c: Contract, method: string, pathname: string): { template: string; operation: Operation } {
  const m = method.toLowerCase();
  for (const { template, pattern } of c.templates) {
    if (!pattern.test(pathname)) continue;
    const operation = c.doc.paths[template]?.[m];
    if (operation && METHODS.has(m)) return { template, operation };
  }
  throw new ContractError(`${method.toUpperCase()} ${pathname}: no operation in the OpenAPI document`);
}

function validatorFor(c: Contract, template: string, method: string, status: string, mediaType: string): ValidateFunction {
  const key = `${method} ${template} ${status} ${mediaType}`;
  let v = c.validators.get(key);
  if (!v) {
    const pointer = ['paths', template, method, 'responses', status, 'content', mediaType, 'schema'].map(escapePointer).join('/');
    v = c.ajv.compile({ $ref: `${DOC_ID}#/${pointer}` });
    c.validators.set(key, v);
  }
  return v;
}

/** What the check needs of an answer, from fetch's Response or from a browser's (Playwright) response. */
export interface ReceivedAnswer {
  status: number;
  /** The Content-Type header's value, or '' when there is none. */
  contentType: string;
  text(): Promise<string>;
}

/** Checks one fetch answer of our API against the document; see assertDocumentedAnswer. */
export function assertDocumentedResponse(baseUrl: string, method: string, url: string, res: Response): Promise<void> {
  return assertDocumentedAnswer(baseUrl, method, url, { status: res.status, contentType: res.headers.get('content-type') ?? '', text: () => res.clone().text() });
}

/**
 * Checks one answer of our API against the document; throws a ContractError naming what differs.
 * Only /api/** paths are API operations (pages and /media are not in the document).
 */
export async function assertDocumentedAnswer(baseUrl: string, method: string, url: string, res: ReceivedAnswer): Promise<void> {
  const { pathname } = new URL(url, baseUrl);
  if (!pathname.startsWith('/api/')) return;
  const c = await loadContract(baseUrl);
  const m = method.toLowerCase();
  let found: ReturnType<typeof findOperation>;
  try {
    found = findOperation(c, m, pathname);
  } catch (e) {
    // Something that is not an operation may only be refused as not there.
    if (res.status === 404 || res.status === 405) return;
    throw new ContractError(`${(e as Error).message}, yet it answered ${res.status} instead of 404 or 405`);
  }
  const { template, operation } = found;
  const label = `${method.toUpperCase()} ${pathname} (${template}) answered ${res.status}`;
  const documented = operation.responses?.[String(res.status)];
  if (!documented) {
    const listed = Object.keys(operation.responses ?? {}).join(', ');
    throw new ContractError(`${label}, which the OpenAPI document does not list (it lists ${listed}). Body: ${(await res.text()).slice(0, 300)}`);
  }
  const contentType = res.contentType.split(';')[0]!.trim().toLowerCase();
  if (contentType !== 'application/json') return; // files (CSV, WebVTT) and empty answers: status checked above
  const content = documented.content ?? {};
  if (!('application/json' in content)) {
    throw new ContractError(`${label} with a JSON body, but the document describes ${Object.keys(content).join(', ') || 'no body'} for that status`);
  }
  const text = await res.text();
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw new ContractError(`${label} with content-type application/json but a body that is not JSON: ${text.slice(0, 200)}`);
  }
  if (content['application/json']?.schema === undefined) return;
  const validate = validatorFor(c, template, m, String(res.status), 'application/json');
  if (!validate(body)) {
    const problems = (validate.errors ?? []).map((e) => `${e.instancePath || '(body)'} ${e.message}${e.params ? ' ' + JSON.stringify(e.params) : ''}`);
    throw new ContractError(`${label}; the body does not match the documented schema:\n  ${problems.join('\n  ')}\nBody: ${text.slice(0, 500)}`);
  }
}
