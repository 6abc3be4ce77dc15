import type { APIRoute } from 'astro';
import { pdfQuerySchema } from '~/lib/sheets/requests';
import { isResponse } from '~/lib/server/authorise';
import { parseValue } from '~/lib/server/http';
import { renderSheetPdf } from '~/lib/server/sheets/pdf';
import { sheetFromRoute } from '~/lib/server/sheets/service';
import { sheetView } from '~/lib/server/sheets/view';

/** The print-ready PDF, A4 or Letter (the sheet's own size unless `size` says otherwise). */
export const GET: APIRoute = async ({ params, locals, url }) => {
  const sheet = await sheetFromRoute(params, locals.user);
  if (isResponse(sheet)) return sheet;
  const query = parseValue(Object.fromEntries(url.searchParams), pdfQuerySchema);
  if (!query.ok) return query.response;
  const view = await sheetView(sheet, locals.user);
  const pdf = await renderSheetPdf(view, query.data.size);
  const name = `colour-sheet-${sheet.id}-${query.data.size ?? sheet.pageSize}.pdf`;
  return new Response(new Uint8Array(pdf), {
    headers: { 'content-type': 'application/pdf', 'content-disposition': `inline; filename="${name}"`, 'content-length': String(pdf.length) },
  });
};
