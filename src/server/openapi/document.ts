import { OpenAPIRegistry, OpenApiGeneratorV31, type RouteConfig } from '@asteasolutions/zod-to-openapi';
import { changePasswordInput, meOutput, signedInOutput, signedOutOutput, signInInput, signOutQuery, signUpInput, signUpOutput } from '~/lib/api/auth-schemas';
import { createLessonInput, lessonListOutput, lessonOutput, updateLessonInput } from '~/lib/api/lesson-schemas';
import { lessonIdParams } from '~/lib/api/route-params';
import { apiDocumentOutput, healthOutput } from '~/lib/api/service-schemas';
import { apiRoutes } from './routes';
import { errors, json } from './responses';
import { billingRoutes } from './routes-billing';
import { mailRoutes } from './routes-mail';
import { markingRoutes } from './routes-marking';
import { captionRoutes } from './routes-captions';
import { studioRoutes } from './routes-studios';

/** Every API route, described from the same zod schemas the endpoints use. */
export function openApiDocument() {
  const registry = new OpenAPIRegistry();
  registry.registerComponent('securitySchemes', 'session', {
    type: 'apiKey',
    in: 'cookie',
    name: 'rm_session',
    description: 'Session cookie set by sign-in (named __Host-rm_session over HTTPS).',
  });
  // Any operation answers 503 while the database (or another service it needs) cannot be reached.
  const add = (route: RouteConfig) => registry.registerPath({ security: [{ session: [] }], ...route, responses: { ...errors(503), ...route.responses } });

  add({
    method: 'post', path: '/api/auth/sign-up', summary: 'Create an account (a member of the studio); the answer is the same when the address already has one, and its owner is e-mailed instead', security: [],
    request: { body: json(signUpInput, 'New account') },
    responses: { 202: json(signUpOutput, 'Check your inbox'), ...errors(400, 429) },
  });
  add({
    method: 'post', path: '/api/auth/sign-in', summary: 'Sign in; sets the session cookie', security: [],
    request: { body: json(signInInput, 'Credentials') },
    responses: { 200: json(signedInOutput, 'Signed in'), ...errors(400, 429) },
  });
  add({
    method: 'post', path: '/api/auth/sign-out', summary: 'Sign out this session, or every session with ?everywhere=1',
    request: { query: signOutQuery },
    responses: { 200: json(signedOutOutput, 'Signed out'), ...errors(401) },
  });
  add({
    method: 'post', path: '/api/account/password', summary: 'Change the password (optionally signing out other sessions)',
    request: { body: json(changePasswordInput, 'Passwords') },
    responses: { 204: { description: 'Changed' }, ...errors(400, 401) },
  });
  add({
    method: 'get', path: '/api/me', summary: 'The signed-in person and their studio roles',
    responses: { 200: json(meOutput, 'You'), ...errors(401) },
  });
  add({
    method: 'get', path: '/api/health', summary: 'Database and storage reachability', security: [],
    responses: {
      200: json(healthOutput, 'All up'),
      503: json(healthOutput, 'Something is down'),
    },
  });
  add({
    method: 'get', path: '/api/openapi.json', summary: 'This document', security: [],
    responses: { 200: json(apiDocumentOutput, 'OpenAPI 3.1 document') },
  });
  add({
    method: 'get', path: '/api/lessons', summary: 'The studio’s classes (staff)',
    responses: { 200: json(lessonListOutput, 'Classes'), ...errors(401, 403) },
  });
  add({
    method: 'post', path: '/api/lessons', summary: 'Create a draft class (staff)',
    request: { body: json(createLessonInput, 'Class details') },
    responses: { 201: json(lessonOutput, 'Created'), ...errors(400, 401, 403) },
  });
  add({
    method: 'get', path: '/api/lessons/{id}', summary: 'One class (staff)', request: { params: lessonIdParams },
    responses: { 200: json(lessonOutput, 'The class'), ...errors(401, 403, 404) },
  });
  add({
    method: 'patch', path: '/api/lessons/{id}', summary: 'Change class details; send the version you read', request: { params: lessonIdParams, body: json(updateLessonInput, 'Changes') },
    responses: { 200: json(lessonOutput, 'Updated'), ...errors(400, 401, 403, 404, 409) },
  });
  add({
    method: 'delete', path: '/api/lessons/{id}', summary: 'Delete a draft class (owner, coach)', request: { params: lessonIdParams },
    responses: { 204: { description: 'Deleted' }, ...errors(401, 403, 404, 409) },
  });
  for (const extra of [...apiRoutes, ...billingRoutes, ...mailRoutes, ...markingRoutes, ...captionRoutes, ...studioRoutes]) add(extra);

  const document = new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: '3.1.0',
    info: {
      title: 'Roundmark API',
      version: '1.0.0',
      description: 'Classes, plans, timelines and the timing check of a Roundmark studio. Errors answer `{ error: { code, message, fields? } }`.',
    },
    servers: [{ url: '/' }],
  });
  stripRegexFlags(document);
  return document;
}

/**
 * zod-to-openapi 9.1 writes a regex with flags as `source/u` (it trims the slashes of
 * `RegExp#toString()` but not the flags), a pattern no string matches. JSON Schema patterns are
 * ECMA-262 in unicode mode already, so the source alone is the right pattern.
 */
function stripRegexFlags(node: unknown): void {
  if (Array.isArray(node)) for (const n of node) stripRegexFlags(n);
  else if (node && typeof node === 'object') {
    const o = node as Record<string, unknown>;
    if (typeof o.pattern === 'string') o.pattern = o.pattern.replace(/\/[dgimsuvy]+$/, '');
    for (const v of Object.values(o)) stripRegexFlags(v);
  }
}
