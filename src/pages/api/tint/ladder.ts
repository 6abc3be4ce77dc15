import type { APIRoute } from 'astro';
import { parseJson, parseValue, problem } from '~/lib/server/http';
import { queryObject, sendCached } from '~/lib/server/http-cache';
import { ladderAnswer } from '~/lib/server/tint-answers';
import { ladderRequestSchema } from '~/lib/tint';

/** Anyone's ladder is the same: caches may keep it, and check it again after a day. */
const CACHE_CONTROL = 'public, max-age=86400';

/** The tint ladder of an alloy: colour and tint band against oxide thickness (a JSON body). */
export const POST: APIRoute = async ({ request, locals }) => {
  const parsed = await parseJson({ request, locals }, ladderRequestSchema);
  if (!parsed.ok) return parsed.response;
  const ladder = ladderAnswer(parsed.data);
  return ladder.ok ? sendCached(request, ladder.answer, 'no-cache') : problem(ladder.status, ladder.message, ladder.field);
};

/** The same from the query (`?alloy=ti-grade-5&toNm=200`), with an ETag, so a repeat costs a 304. */
export const GET: APIRoute = ({ request, url }) => {
  const parsed = parseValue(queryObject(url, ['fromNm', 'toNm', 'stepNm']), ladderRequestSchema);
  if (!parsed.ok) return parsed.response;
  const ladder = ladderAnswer(parsed.data);
  return ladder.ok ? sendCached(request, ladder.answer, CACHE_CONTROL) : problem(ladder.status, ladder.message, ladder.field);
};
