import type { APIRoute } from 'astro';
import { studioAddressOf } from '~/server/http/guards';

/** The finished classes now live under their studio's address (/s/{slug}/library/history). */
export const GET: APIRoute = ({ locals, url, redirect }) => redirect(studioAddressOf(locals, url, '/library/history'), 302);
