import type { APIRoute } from 'astro';
import { z } from 'zod';
import { libraryQuerySchema } from '~/lib/library/query';
import { json, parseValue, problem } from '~/lib/server/http';
import { exportLibrary, libraryCsv, libraryJson } from '~/lib/server/library/export';

const formatSchema = z.object({ format: z.enum(['csv', 'json'], { error: 'Ask for format=csv or format=json.' }) });

/** The library view (same filters and sort as /library, visibility applied) as CSV or JSON. */
export const GET: APIRoute = async (context) => {
  const { format, cursor: _cursor, limit: _limit, offset: _offset, ...rest } = Object.fromEntries(context.url.searchParams);
  const chosen = parseValue({ format }, formatSchema);
  if (!chosen.ok) return chosen.response;
  const query = parseValue(rest, libraryQuerySchema);
  if (!query.ok) return query.response;
  const viewer = context.locals.user;
  if (query.data.mineOnly && !viewer) return problem(401, 'Sign in to export your own coupons.');
  const { coupons, truncated } = await exportLibrary(viewer, query.data);
  if (chosen.data.format === 'json')
    return json(libraryJson(coupons, truncated), 200, { 'content-disposition': 'attachment; filename="oxbloom-library.json"' });
  return new Response(libraryCsv(coupons), {
    headers: {
      'content-type': 'text/csv; charset=utf-8; header=present',
      'content-disposition': 'attachment; filename="oxbloom-library.csv"',
      ...(truncated ? { 'x-oxbloom-truncated': 'true' } : {}),
    },
  });
};
