import type { LibraryQuery } from '~/lib/library/query';
import type { SessionUser } from '~/lib/server/authorise';
import { couponView } from '~/lib/server/coupons';
import { BoundedCache, cachedJson, requestKey, type CachedBody } from '~/lib/server/http-cache';
import { listLibrary, type LibraryPage } from './list';
import { libraryVersion } from './recent';

/** The body of `GET /api/coupons`: one page of the library as the viewer may see it. */
export function libraryAnswer(page: LibraryPage, query: LibraryQuery, viewer: SessionUser | null) {
  return {
    coupons: page.coupons.map((coupon) => ({ ...couponView(coupon, viewer), dominantSwatches: coupon.dominantSwatches })),
    total: page.total,
    totalExact: page.totalExact,
    limit: query.limit,
    offset: query.offset,
    nextCursor: page.nextCursor,
  };
}

const visitorPages = new BoundedCache<string, { version: string; answer: Promise<CachedBody> }>(256);

/**
 * A visitor's page of the library. Visitors all see the same public coupons, and every write that
 * can change what they see raises the whole library's version (recent.ts), so each query's answer
 * is worked out once per version and kept, with its ETag, until the version moves on. The version
 * is read before the page, so a page read after a write is never kept under the version before it.
 * Requests that ask meanwhile share the same reading; a failed one is not kept (the next reads again).
 */
export async function visitorLibraryAnswer(query: LibraryQuery): Promise<CachedBody> {
  const version = await libraryVersion();
  const key = requestKey(query);
  const known = visitorPages.get(key);
  if (known?.version === version) return known.answer;
  const answer = listLibrary(null, query).then((page) => cachedJson(libraryAnswer(page, query, null)));
  visitorPages.set(key, { version, answer });
  answer.catch(() => {
    if (visitorPages.get(key)?.answer === answer) visitorPages.delete(key);
  });
  return answer;
}
