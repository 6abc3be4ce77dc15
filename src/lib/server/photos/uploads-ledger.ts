import { and, asc, eq, gte, like, lt, sql } from 'drizzle-orm';
import { appSettings, photos, uploads } from '../../../../db/schema';
import type { Database } from '../../../../db/client';
import { UPLOAD_EXPIRY_SECONDS, type PhotoContentType, type UploadTicket } from '~/lib/photos';
import { db } from '~/lib/server/db';
import { folderOf, newUploadKey } from './keys';
import { deleteObjects, listKeys, presignPut } from '~/lib/server/storage';

/**
 * The `uploads` table is the ledger of objects in storage that no photo row owns yet (or any
 * more). Every such object has an entry; the sweep deletes the objects of entries gone stale.
 *
 * - A presigned upload adds an entry that expires with the URL (10 minutes); its `createdAt` is
 *   when the URL was issued. A person has at most MAX_OPEN_UPLOADS open (not stale) entries.
 * - Attaching claims the entry (its expiry moves on while the photo is processed); success
 *   removes it in the same transaction that writes the photo row. A file refused at attach (or
 *   whose coupon was deleted meanwhile) is deleted and its entry made stale (forgetLater).
 * - An entry is stale STALE_AFTER_MINUTES after it expires. From then on it can no longer be
 *   claimed, and the sweep clears its folder — unless a photo owns that folder, in which case
 *   only the entry's own key goes (e.g. an original replaced by a copy without its GPS position).
 * - Deleting a photo, or a coupon with its photos, adds a stale entry for each photo's folder in
 *   the transaction that removes the rows, so files a failed deletion leaves behind are swept.
 * - An entry goes only once its key's upload URL can no longer be used (URL_USABLE_MS after
 *   `createdAt`): until then the sweep keeps deleting what arrives but keeps the entry, so a file
 *   sent again to a URL whose upload was refused or deleted is never left without one.
 *
 * Claim and sweep take disjoint sets of entries at every instant (not yet stale / stale), and
 * staleness only grows with time, so any number of app processes may attach and sweep at once.
 */
export const STALE_AFTER_MINUTES = 30;
/** Uploads a person may have open (asked for, not attached, not yet stale) at once. */
export const MAX_OPEN_UPLOADS = 20;
/** How long a claimed upload stays claimed while it is processed. */
const CLAIM_SECONDS = 10 * 60;
/** How long after it was issued an upload URL may still be used: its life, and a margin for clocks that disagree. */
const URL_USABLE_MS = (UPLOAD_EXPIRY_SECONDS + 2 * 60) * 1000;

const minutesAgo = (minutes: number, now = Date.now()) => new Date(now - minutes * 60_000);
const affectedRows = (result: unknown) => (result as [{ affectedRows: number }])[0].affectedRows;

export type UploadRequestResult = { status: 'created'; ticket: UploadTicket } | { status: 'limited'; retryAfterSeconds: number };

/**
 * Records an upload and presigns its PUT, unless the person has MAX_OPEN_UPLOADS open already.
 * The entry is counted after it is inserted and withdrawn when over the limit, so requests at
 * once never get past it together (at worst each sees the others and all withdraw).
 */
export async function createUpload(ownerId: string, contentType: PhotoContentType, byteSize: number): Promise<UploadRequestResult> {
  const key = newUploadKey(ownerId, contentType);
  const now = Date.now();
  const expiresAt = new Date(now + UPLOAD_EXPIRY_SECONDS * 1000);
  await db()
    .insert(uploads)
    .values({ key, ownerId, contentType, byteSize, expiresAt, createdAt: new Date(now) });
  const open = await db()
    .select({ expiresAt: uploads.expiresAt })
    .from(uploads)
    .where(and(eq(uploads.ownerId, ownerId), gte(uploads.expiresAt, minutesAgo(STALE_AFTER_MINUTES, now))))
    .orderBy(asc(uploads.expiresAt));
  if (open.length > MAX_OPEN_UPLOADS) {
    await db().delete(uploads).where(eq(uploads.key, key));
    // A place frees when the oldest open entry goes stale.
    const freesAt = open[0].expiresAt.getTime() + STALE_AFTER_MINUTES * 60_000;
    return { status: 'limited', retryAfterSeconds: Math.max(1, Math.ceil((freesAt - now) / 1000)) };
  }
  const url = await presignPut(key, contentType, byteSize, UPLOAD_EXPIRY_SECONDS);
  return { status: 'created', ticket: { key, url, headers: { 'content-type': contentType }, expiresAt: expiresAt.toISOString() } };
}

/** Why another upload is refused while MAX_OPEN_UPLOADS are open. */
export function tooManyOpenUploads(retryAfterSeconds: number): string {
  const minutes = Math.ceil(retryAfterSeconds / 60);
  return `You have ${MAX_OPEN_UPLOADS} uploads not yet added to a coupon. Add those photos, or try again in ${minutes} minute${minutes === 1 ? '' : 's'}, when unfinished ones have expired.`;
}

/** A claimed upload with what was declared when it was asked for. */
export interface Declared {
  contentType: PhotoContentType;
  byteSize: number;
}

export type Claim = ({ status: 'claimed' } & Declared) | { status: 'unknown' } | { status: 'expired' };

/** Claims an upload of the owner's for attaching: 'unknown' when there is no such entry, 'expired' when it is stale. */
export async function claimUpload(ownerId: string, key: string): Promise<Claim> {
  const now = Date.now();
  const result = await db()
    .update(uploads)
    .set({ expiresAt: new Date(now + CLAIM_SECONDS * 1000) })
    .where(and(eq(uploads.key, key), eq(uploads.ownerId, ownerId), gte(uploads.expiresAt, minutesAgo(STALE_AFTER_MINUTES, now))));
  const [entry] = await db()
    .select({ contentType: uploads.contentType, byteSize: uploads.byteSize })
    .from(uploads)
    .where(and(eq(uploads.key, key), eq(uploads.ownerId, ownerId)));
  if (!entry) return { status: 'unknown' };
  if (affectedRows(result) !== 1) return { status: 'expired' };
  return { status: 'claimed', contentType: entry.contentType as PhotoContentType, byteSize: entry.byteSize };
}

/** Within a transaction: ends an entry once a photo row owns the object. False when another attach got there first. */
export async function settleUpload(tx: Pick<Database, 'delete'>, key: string): Promise<boolean> {
  return affectedRows(await tx.delete(uploads).where(eq(uploads.key, key))) === 1;
}

export interface LedgerEntry {
  key: string;
  ownerId: string;
  contentType: string;
  byteSize: number;
}

/**
 * Within a transaction (or alone): records objects no row will own, stale at once, so the sweep
 * removes them if nothing else does. `urlIssuedBy` is when the key's upload URL was issued, or any
 * later moment: the entry stays until that URL can no longer be used (an existing entry keeps its
 * own, exact, issue time).
 */
export async function forgetLater(tx: Pick<Database, 'insert'>, entry: LedgerEntry, urlIssuedBy: Date) {
  const long = minutesAgo(STALE_AFTER_MINUTES + 1);
  await tx
    .insert(uploads)
    .values({ ...entry, expiresAt: long, createdAt: urlIssuedBy })
    .onDuplicateKeyUpdate({ set: { expiresAt: long } });
}

/** Entries whose key's upload URL can no longer be used: issued before this. */
const urlsUnusableBefore = (now = Date.now()) => new Date(now - URL_USABLE_MS);

/**
 * Drops a stale entry whose objects are gone, once its URL can no longer be used (until then the
 * sweep keeps it). Best effort: a left-over entry is swept anyway.
 */
export async function dropEntry(key: string): Promise<void> {
  await db()
    .delete(uploads)
    .where(and(eq(uploads.key, key), lt(uploads.expiresAt, minutesAgo(STALE_AFTER_MINUTES)), lt(uploads.createdAt, urlsUnusableBefore())))
    .catch(() => undefined);
}

export interface SweepResult {
  entries: number;
  objects: number;
}

/**
 * Deletes the objects of stale ledger entries and then the entries (each once its URL can no
 * longer be used). Safe to run in several processes at once: deleting an object twice is
 * harmless, and an entry is removed only while it is still stale.
 */
export async function sweepStaleUploads(now = Date.now(), batch = 200): Promise<SweepResult> {
  const cutoff = minutesAgo(STALE_AFTER_MINUTES, now);
  const stale = await db()
    .select({ key: uploads.key, ownerId: uploads.ownerId })
    .from(uploads)
    .where(lt(uploads.expiresAt, cutoff))
    .orderBy(asc(uploads.expiresAt))
    .limit(batch);
  const result: SweepResult = { entries: 0, objects: 0 };
  for (const entry of stale) {
    const folder = folderOf(entry.key);
    const owners = await db()
      .select({ originalKey: photos.originalKey })
      .from(photos)
      .where(and(eq(photos.ownerId, entry.ownerId), like(photos.originalKey, `${folder.replace(/[\\%_]/g, '\\$&')}%`)));
    const attached = owners.some((photo) => photo.originalKey === entry.key);
    const doomed = attached ? [] : owners.length > 0 ? [entry.key] : [...new Set([entry.key, ...(await listKeys(folder))])];
    await deleteObjects(doomed);
    result.objects += doomed.length;
    const gone = and(eq(uploads.key, entry.key), lt(uploads.expiresAt, cutoff), lt(uploads.createdAt, urlsUnusableBefore(now)));
    result.entries += affectedRows(await db().delete(uploads).where(gone));
  }
  return result;
}

const SWEEP_SETTING = 'uploads-swept-at';
/** How often some process sweeps. */
export const SWEEP_EVERY_MINUTES = 10;

/**
 * Sweeps if no process has in the last SWEEP_EVERY_MINUTES: the turn is claimed with one
 * conditional UPDATE of a stamp in app_settings, so one process wins however many try.
 */
export async function sweepIfDue(now = Date.now()): Promise<SweepResult | null> {
  await db()
    .insert(appSettings)
    .ignore()
    .values({ key: SWEEP_SETTING, value: new Date(0).toISOString() });
  const due = new Date(now - (SWEEP_EVERY_MINUTES * 60_000 - 5_000)).toISOString();
  const claimed = await db()
    .update(appSettings)
    .set({ value: new Date(now).toISOString() })
    .where(and(eq(appSettings.key, SWEEP_SETTING), sql`${appSettings.value} < ${due}`));
  return affectedRows(claimed) === 1 ? sweepStaleUploads(now) : null;
}

let timer: NodeJS.Timeout | undefined;

/**
 * Starts this process's sweep timer (once; the middleware calls it on every request). Each app
 * process ticks every few minutes with jitter; sweepIfDue lets one of them sweep per period.
 */
export function startUploadSweeper(): void {
  if (timer) return;
  const tick = () => {
    sweepIfDue().catch((error: unknown) => console.error(`[oxbloom] upload sweep failed: ${error instanceof Error ? error.message : error}`));
  };
  timer = setInterval(tick, (SWEEP_EVERY_MINUTES / 2) * 60_000 + Math.floor(Math.random() * 60_000));
  timer.unref();
  setTimeout(tick, 30_000).unref();
}
