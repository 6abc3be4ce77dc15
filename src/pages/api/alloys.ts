import type { APIRoute } from 'astro';
import { listAlloys } from '~/lib/server/alloys';
import { cachedJson, sendCached, type CachedBody } from '~/lib/server/http-cache';

/**
 * The alloy catalogue. It changes only with a release (the seed and migrations write it before the
 * server starts), so it is read once per process and sent with an ETag.
 */
let catalogue: Promise<CachedBody> | undefined;

export const GET: APIRoute = async ({ request }) => {
  catalogue ??= listAlloys()
    .then(cachedJson)
    .catch((error: unknown) => {
      catalogue = undefined;
      throw error;
    });
  return sendCached(request, await catalogue, 'public, max-age=300');
};
