import type { APIRoute } from 'astro';
import { studioAddressOf } from '~/server/http/guards';

/** A class page (and its chapters and captions files) now lives under its studio's address (/s/{slug}/classes/{class}). */
export const GET: APIRoute = ({ locals, params, url, redirect }) =>
  redirect(studioAddressOf(locals, url, `/classes/${params.slug}${params.rest ? `/${params.rest}` : ''}`), 302);
