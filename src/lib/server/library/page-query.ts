import { describeZodError } from '~/lib/server/http';
import { libraryQuerySchema, type LibraryQuery } from '~/lib/library/query';

/**
 * The library page's reading of its URL: a bad value is dropped with a note naming the field (the
 * page still shows the rest), where the API would answer 400.
 */
export function readPageQuery(params: URLSearchParams): { query: LibraryQuery; notes: string[] } {
  const raw: Record<string, string> = Object.fromEntries(params);
  delete raw.offset;
  const notes: string[] = [];
  for (let attempt = 0; attempt < 30; attempt += 1) {
    const result = libraryQuerySchema.safeParse(raw);
    if (result.success) return { query: result.data, notes };
    const { message, field } = describeZodError(result.error);
    const key = field?.split('.')[0];
    if (!key || !(key in raw)) break;
    notes.push(`${message} (left out)`);
    delete raw[key];
  }
  return { query: libraryQuerySchema.parse({}), notes };
}
