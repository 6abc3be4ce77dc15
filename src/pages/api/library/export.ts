import type { APIRoute } from 'astro';
import { z } from 'zod';
import { libraryQuerySchema } from '~/lib/library/query';
import { parseValue, problem } from '~/lib/server/http';
import { exportLibrary } from '~/lib/server/library/export';

const formatSchema = z.object({ format: z.enum(['csv', 'json'], { error: 'Ask for format=csv or format=json.' }) });

/** The library view (same filters and sort as /library, visibility applied) as CSV or JSON, streamed page by page. */
export const GET: APIRoute = async (context) => {
  const { format, cursor: _cursor, limit: _limit, offset: _offset, ...rest } = Object.fromEntries(context.url.searchParams);
  const chosen = parseValue({ format }, formatSchema);
  if (!chosen.ok) return chosen.response;
  const query = parseValue(rest, libraryQuerySchema);
  if (!query.ok) return query.response;
  const viewer = context.locals.user;
  if (query.data.mineOnly && !viewer) return problem(401, 'Sign in to export your own coupons.');
  const { body, truncated } = await exportLibrary(viewer, query.data, chosen.data.format);
  return new Response(body, {
    headers: {
      'content-type': chosen.data.format === 'json' ? 'application/json; charset=utf-8' : 'text/csv; charset=utf-8; header=present',
      'content-disposition': `attachment; filename="oxbloom-library.${chosen.data.format}"`,
      ...(truncated ? { 'x-oxbloom-truncated': 'true' } : {}),
    },
  });
};
