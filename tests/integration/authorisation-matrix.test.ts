import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { api, newJar, type Jar } from '../support/app';
import { demo, signedIn } from '../support/auth';
import { testDatabase } from '../support/database';
import { eq } from 'drizzle-orm';
import { appSettings } from '../../db/schema';
import { demoClass } from '../../scripts/seed/classes';

/**
 * Who may call what: every route × visitor, member, another member, instructor, admin, with the
 * exact status. Bodies are chosen so nothing is changed for real (invalid input where a valid
 * one would write). Later routes add their rows here.
 */
type Who = 'visitor' | 'member' | 'member2' | 'instructor' | 'admin';
const everyone: Who[] = ['visitor', 'member', 'member2', 'instructor', 'admin'];

interface Row {
  route: string;
  method: string;
  path: string | ((ids: Ids) => string);
  json?: unknown;
  /** The exact status for each caller; null where the call would really change data (tested elsewhere). */
  expect: Record<Who, number | null>;
}
interface Ids {
  member2: string;
  /** The demo member's coupons, one per visibility. */
  memberCoupon: Record<'private' | 'members' | 'public', number>;
  /** Photos of the demo member's coupons (the demo seed gives some coupons of each visibility photos). */
  memberPhoto: Record<'private' | 'members', number>;
  /** The demo class: the demo instructor teaches it, the demo member is a student, member2 is not in it. */
  demoClass: number;
  /** The demo instructor's sheets: a draft, and one published for everyone. */
  sheet: Record<'draft' | 'public', number>;
}

const all = (status: number): Record<Who, number> => ({ visitor: status, member: status, member2: status, instructor: status, admin: status });
const signedInOnly = (status: number): Record<Who, number> => ({ ...all(status), visitor: 401 });
const adminOnly = (status: number): Record<Who, number> => ({ visitor: 401, member: 403, member2: 403, instructor: 403, admin: status });

export const matrix: Row[] = [
  { route: 'health', method: 'GET', path: '/api/health', expect: all(200) },
  { route: 'alloy catalogue', method: 'GET', path: '/api/alloys', expect: all(200) },
  { route: 'tint ladder from the query', method: 'GET', path: '/api/tint/ladder?alloy=ti-grade-5', expect: all(200) },
  {
    route: 'tint prediction from the query',
    method: 'GET',
    path: '/api/tint/predict?alloy=ti-grade-5&process=heat&temperatureC=400&holdMinutes=30',
    expect: all(200),
  },
  { route: 'sign-up, invalid', method: 'POST', path: '/api/account/sign-up', json: { email: 'nope' }, expect: all(400) },
  { route: 'forgot password, invalid', method: 'POST', path: '/api/account/forgot-password', json: { email: 'nope' }, expect: all(400) },
  {
    route: 'reset password, bad link',
    method: 'POST',
    path: '/api/account/reset-password',
    json: { token: 'x'.repeat(43), password: 'long enough password' },
    expect: all(400),
  },
  { route: 'confirm e-mail, bad link', method: 'POST', path: '/api/account/confirm-email', json: { token: 'y'.repeat(43) }, expect: all(400) },
  // Signing out really ends the caller's session (and its copies): tests/integration/sessions.test.ts covers signed-in callers.
  { route: 'sign out', method: 'POST', path: '/api/account/sign-out', expect: { visitor: 200, member: null, member2: null, instructor: null, admin: null } },
  {
    route: 'sign out everywhere',
    method: 'POST',
    path: '/api/account/sign-out-everywhere',
    expect: { visitor: 401, member: null, member2: null, instructor: null, admin: null },
  },
  { route: 'my account', method: 'GET', path: '/api/account', expect: signedInOnly(200) },
  { route: 'rename me, invalid', method: 'PATCH', path: '/api/account', json: { name: '' }, expect: signedInOnly(400) },
  {
    route: 'change password, too short',
    method: 'POST',
    path: '/api/account/password',
    json: { currentPassword: 'x', newPassword: 'short' },
    expect: signedInOnly(400),
  },
  { route: 'download my data', method: 'GET', path: '/api/account/export', expect: signedInOnly(200) },
  { route: 'delete me, unconfirmed', method: 'DELETE', path: '/api/account', json: { confirmation: 'no' }, expect: signedInOnly(400) },
  { route: 'list people', method: 'GET', path: '/api/admin/users', expect: adminOnly(200) },
  { route: 'set a role', method: 'PATCH', path: (ids) => `/api/admin/users/${ids.member2}`, json: { role: 'member' }, expect: adminOnly(200) },
  { route: 'set a role, unknown person', method: 'PATCH', path: '/api/admin/users/no-such-person', json: { role: 'member' }, expect: adminOnly(404) },

  // coupons (the owner is the demo member)
  { route: 'list coupons', method: 'GET', path: '/api/coupons', expect: all(200) },
  { route: 'list my coupons', method: 'GET', path: '/api/coupons?mine=1', expect: signedInOnly(200) },
  { route: 'log a coupon, invalid', method: 'POST', path: '/api/coupons', json: { title: '' }, expect: signedInOnly(400) },
  {
    route: 'open a private coupon',
    method: 'GET',
    path: (ids) => `/api/coupons/${ids.memberCoupon.private}`,
    expect: { visitor: 404, member: 200, member2: 404, instructor: 404, admin: 200 },
  },
  { route: 'open a members coupon', method: 'GET', path: (ids) => `/api/coupons/${ids.memberCoupon.members}`, expect: { ...all(200), visitor: 404 } },
  { route: 'open a public coupon', method: 'GET', path: (ids) => `/api/coupons/${ids.memberCoupon.public}`, expect: all(200) },
  {
    route: 'change a private coupon, invalid',
    method: 'PATCH',
    path: (ids) => `/api/coupons/${ids.memberCoupon.private}`,
    json: { temperatureC: 5000 },
    expect: { visitor: 401, member: 400, member2: 404, instructor: 404, admin: 400 },
  },
  {
    route: 'change a public coupon, invalid',
    method: 'PATCH',
    path: (ids) => `/api/coupons/${ids.memberCoupon.public}`,
    json: { temperatureC: 5000 },
    expect: { visitor: 401, member: 400, member2: 403, instructor: 403, admin: 400 },
  },
  // The owner's and an admin's deletes really delete: tests/integration/coupons.test.ts covers them.
  {
    route: 'delete a private coupon',
    method: 'DELETE',
    path: (ids) => `/api/coupons/${ids.memberCoupon.private}`,
    expect: { visitor: 401, member: null, member2: 404, instructor: 404, admin: null },
  },
  {
    route: 'delete a members coupon',
    method: 'DELETE',
    path: (ids) => `/api/coupons/${ids.memberCoupon.members}`,
    expect: { visitor: 401, member: null, member2: 403, instructor: 403, admin: null },
  },

  // photos and uploads (the photos are the demo member's; uploads and attaches that would store something are tested in uploads.test.ts)
  {
    route: 'ask for an upload URL, wrong type',
    method: 'POST',
    path: '/api/uploads',
    json: { filename: 'a.gif', contentType: 'image/gif', size: 10 },
    expect: signedInOnly(415),
  },
  {
    route: 'list a private coupon’s photos',
    method: 'GET',
    path: (ids) => `/api/coupons/${ids.memberCoupon.private}/photos`,
    expect: { visitor: 404, member: 200, member2: 404, instructor: 404, admin: 200 },
  },
  {
    route: 'list a members coupon’s photos',
    method: 'GET',
    path: (ids) => `/api/coupons/${ids.memberCoupon.members}/photos`,
    expect: { ...all(200), visitor: 404 },
  },
  { route: 'list a public coupon’s photos', method: 'GET', path: (ids) => `/api/coupons/${ids.memberCoupon.public}/photos`, expect: all(200) },
  {
    route: 'attach to a private coupon, invalid',
    method: 'POST',
    path: (ids) => `/api/coupons/${ids.memberCoupon.private}/photos`,
    json: {},
    expect: { visitor: 401, member: 400, member2: 404, instructor: 404, admin: 400 },
  },
  {
    route: 'attach to a public coupon, invalid',
    method: 'POST',
    path: (ids) => `/api/coupons/${ids.memberCoupon.public}/photos`,
    json: {},
    expect: { visitor: 401, member: 400, member2: 403, instructor: 403, admin: 400 },
  },
  {
    route: 'attach someone else’s upload',
    method: 'POST',
    path: (ids) => `/api/coupons/${ids.memberCoupon.private}/photos`,
    json: { key: 'users/someone-else/photos/x/original.jpg' },
    expect: { visitor: 401, member: 403, member2: 404, instructor: 404, admin: 403 },
  },
  {
    route: 'open a photo of a private coupon',
    method: 'GET',
    path: (ids) => `/api/photos/${ids.memberPhoto.private}`,
    expect: { visitor: 404, member: 200, member2: 404, instructor: 404, admin: 200 },
  },
  { route: 'open a photo of a members coupon', method: 'GET', path: (ids) => `/api/photos/${ids.memberPhoto.members}`, expect: { ...all(200), visitor: 404 } },
  {
    route: 'mark regions on a private photo, invalid',
    method: 'PUT',
    path: (ids) => `/api/photos/${ids.memberPhoto.private}/regions`,
    json: { regions: 'all' },
    expect: { visitor: 401, member: 400, member2: 404, instructor: 404, admin: 400 },
  },
  {
    route: 'mark regions on a members photo, invalid',
    method: 'PUT',
    path: (ids) => `/api/photos/${ids.memberPhoto.members}/regions`,
    json: { regions: 'all' },
    expect: { visitor: 401, member: 400, member2: 403, instructor: 403, admin: 400 },
  },
  // The owner's and an admin's deletes really delete: tests/integration/photos.test.ts covers them.
  {
    route: 'delete a photo of a private coupon',
    method: 'DELETE',
    path: (ids) => `/api/photos/${ids.memberPhoto.private}`,
    expect: { visitor: 401, member: null, member2: 404, instructor: 404, admin: null },
  },
  {
    route: 'delete a photo of a members coupon',
    method: 'DELETE',
    path: (ids) => `/api/photos/${ids.memberPhoto.members}`,
    expect: { visitor: 401, member: null, member2: 403, instructor: 403, admin: null },
  },

  // the library (lists only what each caller may see: tests/integration/library.test.ts)
  {
    route: 'browse the library, filtered and sorted',
    method: 'GET',
    path: '/api/coupons?pair=ti-grade-2%2Bti-grade-5&sort=temperature&unit=F&tempMin=400',
    expect: all(200),
  },
  { route: 'browse the library, bad filter', method: 'GET', path: '/api/coupons?alloy=unobtainium', expect: all(400) },
  { route: 'browse the library, forged cursor', method: 'GET', path: '/api/coupons?cursor=eyJpZCI6MX0', expect: all(400) },
  { route: 'browse my part of the library', method: 'GET', path: '/api/coupons?mine=1&photos=1', expect: signedInOnly(200) },
  // colour search (hits only from visible coupons: tests/integration/library-colour-search.test.ts)
  { route: 'search swatches by colour', method: 'GET', path: '/api/swatches/search?hex=%23c08040&alloy=ti-grade-2&maxDeltaE=10', expect: all(200) },
  { route: 'export the library view', method: 'GET', path: '/api/library/export?format=csv&alloy=ti-grade-2', expect: all(200) },
  { route: 'export my part of the library', method: 'GET', path: '/api/library/export?format=json&mine=1', expect: signedInOnly(200) },
  { route: 'search swatches, bad hex', method: 'GET', path: '/api/swatches/search?hex=orange', expect: all(400) },
  // the heat matrix of a pair or one alloy (visible coupons only: tests/integration/library-pairs.test.ts)
  { route: 'heat matrix of an alloy pair', method: 'GET', path: '/api/library/pairs/ti-grade-5+ti-grade-2', expect: all(200) },
  { route: 'heat matrix, unknown alloy', method: 'GET', path: '/api/library/pairs/ti-grade-2+unobtainium', expect: all(400) },
  { route: 'heat matrix, the same alloy twice', method: 'GET', path: '/api/library/pairs/ti-grade-2+ti-grade-2', expect: all(400) },
  { route: 'heat matrix of one alloy', method: 'GET', path: '/api/library/alloys/steel-1084', expect: all(200) },
  { route: 'heat matrix of one alloy, unknown', method: 'GET', path: '/api/library/alloys/%00', expect: all(400) },
  // compare (coupons a caller may not see are left out and counted: tests/integration/compare.test.ts)
  {
    route: 'compare a public coupon with a private one',
    method: 'GET',
    path: (ids) => `/api/compare?ids=${ids.memberCoupon.public},${ids.memberCoupon.private}&ids=${ids.memberCoupon.members}`,
    expect: all(200),
  },
  { route: 'compare, bad ids', method: 'GET', path: '/api/compare?ids=1,x', expect: all(400) },
  { route: 'compare, one coupon', method: 'GET', path: '/api/compare?ids=1', expect: all(400) },

  // classes (the demo class: member is a student, member2 an outsider; tests/integration/classes.test.ts and class-invitations.test.ts)
  { route: 'my classes', method: 'GET', path: '/api/classes', expect: signedInOnly(200) },
  {
    route: 'start a class, invalid',
    method: 'POST',
    path: '/api/classes',
    json: { name: '' },
    expect: { visitor: 401, member: 403, member2: 403, instructor: 400, admin: 400 },
  },
  {
    route: 'open a class',
    method: 'GET',
    path: (ids) => `/api/classes/${ids.demoClass}`,
    expect: { visitor: 404, member: 200, member2: 404, instructor: 200, admin: 200 },
  },
  { route: 'open a class, unknown', method: 'GET', path: '/api/classes/99999999', expect: all(404) },
  { route: 'open a class, not an id', method: 'GET', path: '/api/classes/1e2', expect: all(404) },
  {
    route: 'change a class, invalid',
    method: 'PATCH',
    path: (ids) => `/api/classes/${ids.demoClass}`,
    json: { name: '' },
    expect: { visitor: 401, member: 403, member2: 404, instructor: 400, admin: 400 },
  },
  // The instructor's and an admin's deletes really delete.
  {
    route: 'delete a class',
    method: 'DELETE',
    path: (ids) => `/api/classes/${ids.demoClass}`,
    expect: { visitor: 401, member: 403, member2: 404, instructor: null, admin: null },
  },
  {
    route: 'list a class’s invitations',
    method: 'GET',
    path: (ids) => `/api/classes/${ids.demoClass}/invitations`,
    expect: { visitor: 401, member: 403, member2: 404, instructor: 200, admin: 200 },
  },
  {
    route: 'invite to a class, invalid',
    method: 'POST',
    path: (ids) => `/api/classes/${ids.demoClass}/invitations`,
    json: { emails: ['not an address'] },
    expect: { visitor: 401, member: 403, member2: 404, instructor: 400, admin: 400 },
  },
  {
    route: 'revoke an invitation, unknown',
    method: 'DELETE',
    path: (ids) => `/api/classes/${ids.demoClass}/invitations/99999999`,
    expect: { visitor: 401, member: 403, member2: 404, instructor: 404, admin: 404 },
  },
  {
    route: 'resend an invitation, unknown',
    method: 'POST',
    path: (ids) => `/api/classes/${ids.demoClass}/invitations/99999999/resend`,
    expect: { visitor: 401, member: 403, member2: 404, instructor: 404, admin: 404 },
  },
  {
    route: 'remove a student, not in the class',
    method: 'DELETE',
    path: (ids) => `/api/classes/${ids.demoClass}/members/no-such-person`,
    expect: { visitor: 401, member: 403, member2: 404, instructor: 404, admin: 404 },
  },
  // The member sharing their own coupon really shares it: tests/integration/classes.test.ts covers it.
  {
    route: 'share a private coupon with a class',
    method: 'PUT',
    path: (ids) => `/api/classes/${ids.demoClass}/coupons/${ids.memberCoupon.private}`,
    expect: { visitor: 401, member: null, member2: 404, instructor: 404, admin: 403 },
  },
  {
    route: 'share a coupon with a class, unknown coupon',
    method: 'PUT',
    path: (ids) => `/api/classes/${ids.demoClass}/coupons/99999999`,
    expect: { visitor: 401, member: 404, member2: 404, instructor: 404, admin: 404 },
  },
  {
    route: 'unshare a coupon, unknown coupon',
    method: 'DELETE',
    path: (ids) => `/api/classes/${ids.demoClass}/coupons/99999999`,
    expect: { visitor: 401, member: 404, member2: 404, instructor: 404, admin: 404 },
  },
  // colour sheets (the owner is the demo instructor; class audiences and students: tests/integration/sheets.test.ts)
  { route: 'list sheets', method: 'GET', path: '/api/sheets', expect: all(200) },
  {
    route: 'start a sheet, invalid',
    method: 'POST',
    path: '/api/sheets',
    json: { title: '' },
    expect: { visitor: 401, member: 403, member2: 403, instructor: 400, admin: 400 },
  },
  {
    route: 'open a draft sheet',
    method: 'GET',
    path: (ids) => `/api/sheets/${ids.sheet.draft}`,
    expect: { visitor: 404, member: 404, member2: 404, instructor: 200, admin: 200 },
  },
  { route: 'open a public sheet', method: 'GET', path: (ids) => `/api/sheets/${ids.sheet.public}`, expect: all(200) },
  {
    route: 'change a draft sheet, invalid',
    method: 'PATCH',
    path: (ids) => `/api/sheets/${ids.sheet.draft}`,
    json: { title: '' },
    expect: { visitor: 401, member: 404, member2: 404, instructor: 400, admin: 400 },
  },
  {
    route: 'change a public sheet, invalid',
    method: 'PATCH',
    path: (ids) => `/api/sheets/${ids.sheet.public}`,
    json: { title: '' },
    expect: { visitor: 401, member: 403, member2: 403, instructor: 400, admin: 400 },
  },
  {
    route: 'delete a draft sheet',
    method: 'DELETE',
    path: (ids) => `/api/sheets/${ids.sheet.draft}`,
    expect: { visitor: 401, member: 404, member2: 404, instructor: null, admin: null },
  },
  {
    route: 'delete a public sheet',
    method: 'DELETE',
    path: (ids) => `/api/sheets/${ids.sheet.public}`,
    expect: { visitor: 401, member: 403, member2: 403, instructor: null, admin: null },
  },
  {
    route: 'a draft sheet’s PDF',
    method: 'GET',
    path: (ids) => `/api/sheets/${ids.sheet.draft}/pdf`,
    expect: { visitor: 404, member: 404, member2: 404, instructor: 200, admin: 200 },
  },
  { route: 'a public sheet’s PDF, Letter', method: 'GET', path: (ids) => `/api/sheets/${ids.sheet.public}/pdf?size=letter`, expect: all(200) },
  { route: 'a public sheet’s PDF, unknown size', method: 'GET', path: (ids) => `/api/sheets/${ids.sheet.public}/pdf?size=a3`, expect: all(400) },
];

const jars = {} as Record<Who, Jar>;
const ids = {} as Ids;

beforeAll(async () => {
  jars.visitor = newJar();
  jars.member = await signedIn(demo.member);
  jars.member2 = await signedIn(demo.member2);
  jars.instructor = await signedIn(demo.instructor);
  jars.admin = await signedIn(demo.admin);
  ids.member2 = ((await (await api('/api/account', { jar: jars.member2 })).json()) as { id: string }).id;
  // Only the demo's own coupons: other test files add and delete coupons of the member meanwhile.
  const { db, pool } = testDatabase();
  const [marker] = await db.select().from(appSettings).where(eq(appSettings.key, 'demo-seeded'));
  await pool.end();
  const listed = (
    (await (await api('/api/coupons?mine=1&limit=100', { jar: jars.member })).json()) as {
      coupons: { id: number; createdAt: string; visibility: 'private' | 'members' | 'public' }[];
    }
  ).coupons;
  const mine = listed.filter((coupon) => new Date(coupon.createdAt) < marker.createdAt);
  const first = (visibility: 'private' | 'members' | 'public') => mine.find((coupon) => coupon.visibility === visibility)!.id;
  ids.memberCoupon = { private: first('private'), members: first('members'), public: first('public') };
  const photoOf = async (visibility: 'private' | 'members') => {
    for (const coupon of mine.filter((candidate) => candidate.visibility === visibility)) {
      const { photos } = (await (await api(`/api/coupons/${coupon.id}/photos`, { jar: jars.member })).json()) as { photos: { id: number }[] };
      if (photos.length) return photos[0].id;
    }
    throw new Error(`The demo member has no ${visibility} coupon with a photo`);
  };
  ids.memberPhoto = { private: await photoOf('private'), members: await photoOf('members') };
  const classes = ((await (await api('/api/classes', { jar: jars.instructor })).json()) as { classes: { id: number; name: string }[] }).classes;
  ids.demoClass = classes.find((cls) => cls.name === demoClass.name)!.id;
  const startSheet = async (title: string) => {
    const response = await api('/api/sheets', { jar: jars.instructor, json: { title, audience: 'public' } });
    return ((await response.json()) as { id: number }).id;
  };
  ids.sheet = { draft: await startSheet('Matrix draft sheet'), public: await startSheet('Matrix public sheet') };
  await api(`/api/sheets/${ids.sheet.public}`, { method: 'PATCH', jar: jars.instructor, json: { status: 'published' } });
});

afterAll(async () => {
  for (const id of Object.values(ids.sheet ?? {})) await api(`/api/sheets/${id}`, { method: 'DELETE', jar: jars.instructor });
});

const cases = matrix.flatMap((row) => everyone.filter((who) => row.expect[who] !== null).map((who) => ({ ...row, who, status: row.expect[who] })));

describe('authorisation matrix', () => {
  it.each(cases)('$method $route as $who → $status', async ({ method, path, json, who, status }) => {
    // A copy of the jar, so a row that signs out doesn't sign the next row out.
    const jar = { cookies: new Map(jars[who].cookies) };
    const response = await api(typeof path === 'function' ? path(ids) : path, { method, json, jar });
    expect(response.status).toBe(status);
  });
});

describe('no route answers 500 to a stranger', () => {
  const writes = matrix.filter((row) => row.method !== 'GET' && row.method !== 'DELETE');
  const junk: [string, RequestInit][] = [
    ['not JSON', { body: '{"half', headers: { 'content-type': 'application/json' } }],
    ['an array', { body: '[1,2,3]', headers: { 'content-type': 'application/json' } }],
    ['wrong types', { body: '{"email":5,"password":[],"token":{},"name":null,"role":7}', headers: { 'content-type': 'application/json' } }],
    ['no body', {}],
  ];
  const callers: Who[] = ['visitor', 'member'];
  // Rows that would really change data for a caller (null) are left out for that caller here too.
  it.each(
    writes.flatMap((row) => callers.filter((who) => row.expect[who] !== null).flatMap((who) => junk.map(([label, init]) => ({ ...row, who, label, init })))),
  )('$method $route as $who with $label', async ({ method, path, who, init }) => {
    const jar = { cookies: new Map(jars[who].cookies) };
    const response = await api(typeof path === 'function' ? path(ids) : path, { ...init, method, jar });
    expect(response.status).toBeLessThan(500);
  });
});

describe('no page answers 500 to a stranger', () => {
  const pages = [
    '/',
    '/safety',
    '/sign-in',
    '/sign-in?error=Verification&callbackUrl=//evil.example',
    '/sign-in/check-email',
    '/sign-in/problem?error=x',
    '/sign-up',
    '/forgot-password',
    '/reset-password',
    '/reset-password?token=abc',
    '/confirm-email',
    '/confirm-email?token=%00%ff',
    '/account',
    '/admin/users',
    '/coupons',
    '/coupons/new',
    '/sheets',
    '/sheets/new',
    '/sheets/abc',
    '/sheets/999999999',
    '/sheets/1e2/edit',
    '/sheets/999999999/edit',
    '/coupons/abc',
    '/coupons/0',
    '/coupons/99999999',
    '/coupons/1/edit',
    '/tint-ladder',
    '/tint-ladder?alloy=unobtainium&light=x',
    '/heat-planner',
    '/library',
    '/library?view=grid&sort=hold&order=asc',
    '/library?cursor=%00&alloy=x&tempMin=hot&limit=-1&mine=1',
    '/library?pair=a%2Bb%2Bc&unit=K',
    '/library/search',
    '/library/search?hex=%23c08040&maxDeltaE=3',
    '/library/search?hex=%00&alloy=x&maxDeltaE=-1&limit=x',
    '/library/pairs',
    '/library/pairs?a=x&b=%00&unit=K',
    '/library/pairs/ti-grade-2+ti-grade-5',
    '/library/pairs/ti-grade-2+ti-grade-5?unit=F',
    '/library/pairs/x+y',
    '/library/pairs/%00',
    '/library/alloys/copper-c11000',
    '/library/alloys/..%2F..',
    '/compare',
    '/compare?ids=1,2',
    '/compare?ids=1,2,3,4,5',
    '/compare?ids=%00&ids=x,,&ids=99999999999',
    '/classes',
    '/classes/new',
    '/classes/abc',
    '/classes/0',
    '/classes/99999999',
    '/classes/join',
    '/classes/join?token=abc',
    `/classes/join?token=${'q'.repeat(43)}`,
  ];
  it.each(pages.flatMap((path) => (['visitor', 'member'] as Who[]).map((who) => ({ path, who }))))('GET $path as $who', async ({ path, who }) => {
    const response = await api(path, { jar: { cookies: new Map(jars[who].cookies) } });
    expect(response.status).toBeLessThan(500);
  });
  it.each(pages.filter((path) => !path.includes('?')))('POST junk to %s', async (path) => {
    const response = await api(path, {
      form: { intent: 'delete', token: 'x', email: 'nope', role: 'admin', userId: 'x' },
      jar: { cookies: new Map(jars.member.cookies) },
    });
    expect(response.status).toBeLessThan(500);
  });
});
