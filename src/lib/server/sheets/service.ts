import type { SheetSwatchSnapshot } from '../../../../db/schema';
import { config } from '../config';
import { problem } from '../http';
import { sendMail } from '../mail';
import { routeId } from '../route-params';
import { maySee, type Viewer } from '../visibility';
import { layersOf } from '../coupons';
import type { UpdateSheetInput } from '~/lib/sheets/requests';
import { classIdsOf, maySeeSheet, mayUseClass, sharedWithClass, studentsOf } from './access';
import { findSheet, itemsOf, publishSheet, swatchSources, unpublishSheet, updateSheet, userEmails, type ItemToWrite, type SheetRow } from './records';

/** The steps the sheet routes share: find a sheet someone may see, check and apply a change. */

const notFound = () => problem(404, 'That sheet was not found.');

/** The sheet of a route's `[id]`, or a 404 when it doesn't exist or the viewer may not see it. */
export async function sheetFromRoute(params: Record<string, string | undefined>, viewer: Viewer | null): Promise<SheetRow | Response> {
  const id = routeId(params, 'That sheet');
  if (id instanceof Response) return id;
  const sheet = await findSheet(id);
  if (!sheet || !maySeeSheet(viewer, sheet, await classIdsOf(viewer))) return notFound();
  return sheet;
}

/** Checks a class a sheet is put in: the caller must teach it. */
export async function checkClass(viewer: Viewer, classId: number | null | undefined): Promise<Response | null> {
  if (classId === undefined || classId === null) return null;
  return (await mayUseClass(viewer, classId)) ? null : problem(400, 'classId: choose a class you teach.', 'classId');
}

/**
 * Turns the sent entries into rows: a kept entry (`itemId`, or a swatch already on the sheet) keeps
 * its swatch and snapshot; a new
 * swatch must be one the owner may see, or one shared with the sheet's class, and its colour and
 * heat record are copied as the snapshot.
 */
export async function resolveItems(
  sheet: SheetRow,
  classId: number | null,
  items: NonNullable<UpdateSheetInput['items']>,
  viewer: Viewer,
): Promise<ItemToWrite[] | Response> {
  const rows = await itemsOf(sheet.id);
  const existing = new Map(rows.map((row) => [row.id, row]));
  const onSheet = new Map(rows.flatMap((row) => (row.swatchId === null ? [] : [[row.swatchId, row] as const])));
  const newIds = items.flatMap((item) => (item.kind === 'swatch' && item.swatchId !== undefined ? [item.swatchId] : []));
  const sources = await swatchSources(newIds);
  const couponIds = [...new Set([...sources.values()].map((source) => source.couponId))];
  const [shared, layers] = await Promise.all([sharedWithClass(classId, couponIds), layersOf(couponIds)]);
  const written: ItemToWrite[] = [];
  for (const [index, item] of items.entries()) {
    if (item.kind === 'heading') {
      written.push({ kind: 'heading', heading: item.text });
      continue;
    }
    const { itemId, swatchId, ...annotation } = item;
    if (itemId !== undefined) {
      const kept = existing.get(itemId);
      if (!kept || kept.kind !== 'swatch') return problem(400, `items.${index}.itemId: that entry is not on this sheet.`, `items.${index}.itemId`);
      written.push({ ...annotation, swatchId: kept.swatchId, couponId: kept.couponId, snapshot: kept.snapshot });
      continue;
    }
    // A swatch already on the sheet keeps its snapshot, so a later change of colour stays visible.
    const kept = onSheet.get(swatchId!);
    if (kept) {
      written.push({ ...annotation, swatchId: kept.swatchId, couponId: kept.couponId, snapshot: kept.snapshot });
      continue;
    }
    const source = sources.get(swatchId!);
    const allowed = source && (maySee(viewer, { ownerId: source.ownerId, visibility: source.visibility }) || shared.has(source.couponId));
    if (!source || !allowed) return problem(400, `items.${index}.swatchId: that swatch was not found.`, `items.${index}.swatchId`);
    const snapshot: SheetSwatchSnapshot = {
      hex: source.hex,
      lab: source.lab,
      couponTitle: source.couponTitle,
      temperatureC: source.temperatureC,
      holdSeconds: source.holdSeconds,
      process: source.process,
      alloys: (layers.get(source.couponId) ?? []).map((layer) => layer.alloyName),
    };
    written.push({ ...annotation, swatchId: source.swatchId, couponId: source.couponId, snapshot });
  }
  return written;
}

/** Applies a checked change; publishing mails the class's students once. */
export async function changeSheet(sheet: SheetRow, input: UpdateSheetInput, viewer: Viewer): Promise<Response | null> {
  const classRefusal = await checkClass(viewer, input.classId);
  if (classRefusal) return classRefusal;
  const classId = input.classId !== undefined ? input.classId : sheet.classId;
  const audience = input.audience ?? sheet.audience;
  const status = input.status ?? sheet.status;
  if (status === 'published' && audience === 'class' && classId === null) {
    return problem(400, 'audience: a sheet for a class needs a class; choose one, or publish it to everyone.', 'audience');
  }
  let items: ItemToWrite[] | undefined;
  if (input.items) {
    const resolved = await resolveItems(sheet, classId, input.items, viewer);
    if (resolved instanceof Response) return resolved;
    items = resolved;
  }
  const { items: _items, status: _status, ...settings } = input;
  void _items;
  void _status;
  await updateSheet(sheet.id, settings, items);
  if (input.status === 'draft' && sheet.status === 'published') await unpublishSheet(sheet.id);
  if (input.status === 'published' && (await publishSheet(sheet.id)) && classId !== null) await mailStudents(sheet.id, classId, input.title ?? sheet.title);
  return null;
}

async function mailStudents(sheetId: number, classId: number, title: string): Promise<void> {
  const students = await userEmails((await studentsOf(classId)).map((student) => student.userId));
  const link = new URL(`/sheets/${sheetId}`, config().APP_URL).toString();
  const results = await Promise.allSettled(
    students.map((student) =>
      sendMail({
        to: student.email,
        subject: `New colour sheet: ${title}`,
        text: `Hello${student.name ? ` ${student.name}` : ''},\n\nYour instructor published a colour sheet for your class on Oxbloom: "${title}".\n\nSee it and download the PDF: ${link}\n\nScreen and print colours differ from the metal: judge colour on the metal itself.\n`,
      }),
    ),
  );
  const failed = results.filter((result) => result.status === 'rejected').length;
  if (failed) console.error(`[sheets] ${failed} publish mail(s) for sheet ${sheetId} could not be sent`);
}
