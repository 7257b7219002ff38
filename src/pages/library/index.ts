import type { APIRoute } from 'astro';
import { studioAddressOf } from '~/server/http/guards';

/** The library now lives under its studio's address (/s/{slug}/library). */
export const GET: APIRoute = ({ locals, url, redirect }) => redirect(studioAddressOf(locals, url, '/library'), 302);
