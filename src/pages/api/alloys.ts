import type { APIRoute } from 'astro';
import { listAlloys } from '~/lib/server/alloys';
import { json } from '~/lib/server/http';

export const GET: APIRoute = async () => json(await listAlloys(), 200, { 'cache-control': 'public, max-age=300' });
