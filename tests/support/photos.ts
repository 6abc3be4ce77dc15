// Helpers for the photo tests: coupons inserted straight into the test database, and the upload
// path driven through HTTP the way the browser drives it (presign, PUT to storage, attach).
import { eq, inArray } from 'drizzle-orm';
import { expect } from 'vitest';
import type { Database } from '../../db/client';
import { alloys, couponLayers, coupons, users } from '../../db/schema';
import type { PhotoView, RegionInput, UploadTicket } from '~/lib/photos';
import { api, type Jar } from './app';
import { deleteCoupons } from '../fixtures/library-coupons';

export async function userIdOf(db: Database, email: string): Promise<string> {
  const [row] = await db.select({ id: users.id }).from(users).where(eq(users.email, email));
  if (!row) throw new Error(`No user ${email} in the test database`);
  return row.id;
}

export interface TestCoupon {
  id: number;
  /** Layer ids in position order. */
  layerIds: number[];
}

/** A coupon of `ownerEmail` with these layers (alloy slugs), inserted directly. */
export async function insertCoupon(db: Database, ownerEmail: string, layers: string[], visibility: 'private' | 'members' | 'public'): Promise<TestCoupon> {
  const ownerId = await userIdOf(db, ownerEmail);
  const alloyRows = await db.select({ id: alloys.id, slug: alloys.slug }).from(alloys).where(inArray(alloys.slug, layers));
  const [{ id }] = await db
    .insert(coupons)
    .values({
      ownerId,
      title: `Photo test ${layers.join(' / ')}`,
      layerKey: [...layers].sort().join('+'),
      surfacePrep: 'ground',
      process: 'oven',
      temperatureC: 560,
      holdSeconds: 1800,
      visibility,
    })
    .$returningId();
  const layerIds: number[] = [];
  for (const [position, slug] of layers.entries()) {
    const alloyId = alloyRows.find((row) => row.slug === slug)!.id;
    const [layer] = await db.insert(couponLayers).values({ couponId: id, position, alloyId }).$returningId();
    layerIds.push(layer.id);
  }
  return { id, layerIds };
}

/** Deletes coupons inserted here, bumping their alloys' library versions as the app's deletion does. */
export async function deleteTestCoupons(db: Database, ids: number[]): Promise<void> {
  await deleteCoupons(db, ids);
}

/** When an upload URL stops working: its X-Amz-Date plus X-Amz-Expires seconds (AWS Signature Version 4 query parameters). */
export function urlExpiry(ticket: UploadTicket): number {
  const url = new URL(ticket.url);
  const [, year, month, day, hour, minute, second] = /^(\d{4})(\d{2})(\d{2})T(\d{2})(\d{2})(\d{2})Z$/.exec(url.searchParams.get('X-Amz-Date')!)!;
  return Date.parse(`${year}-${month}-${day}T${hour}:${minute}:${second}Z`) + Number(url.searchParams.get('X-Amz-Expires')) * 1000;
}

/** POST /api/uploads; returns the raw response. */
export const requestUpload = (jar: Jar | undefined, body: unknown) => api('/api/uploads', { jar, json: body });

/** Asks for an upload URL, checking it was given. */
export async function presign(jar: Jar, filename: string, contentType: string, size: number): Promise<UploadTicket> {
  const response = await requestUpload(jar, { filename, contentType, size });
  expect(response.status, await response.clone().text()).toBe(201);
  return response.json() as Promise<UploadTicket>;
}

/** PUTs bytes to a presigned URL the way the browser does (straight to storage). */
export async function putToStorage(ticket: UploadTicket, bytes: Uint8Array): Promise<void> {
  const response = await fetch(ticket.url, { method: 'PUT', headers: ticket.headers, body: new Uint8Array(bytes) });
  expect(response.status).toBe(200);
}

export const attach = (jar: Jar | undefined, couponId: number, body: unknown) => api(`/api/coupons/${couponId}/photos`, { jar, json: body });

/** The whole path for one photo; returns the attach response. */
export async function uploadPhoto(
  jar: Jar,
  couponId: number,
  bytes: Uint8Array,
  options: { contentType?: string; regions?: RegionInput[]; filename?: string } = {},
) {
  const contentType = options.contentType ?? 'image/jpeg';
  const ticket = await presign(jar, options.filename ?? 'coupon.jpg', contentType, Math.max(1, bytes.length));
  await putToStorage(ticket, bytes);
  const response = await attach(jar, couponId, { key: ticket.key, regions: options.regions });
  return { ticket, response };
}

/** Uploads and attaches, expecting success; returns the stored photo. */
export async function storedPhoto(jar: Jar, couponId: number, bytes: Uint8Array, options: Parameters<typeof uploadPhoto>[3] = {}): Promise<PhotoView> {
  const { response } = await uploadPhoto(jar, couponId, bytes, options);
  expect(response.status, await response.clone().text()).toBe(201);
  return response.json() as Promise<PhotoView>;
}
