import { createHash, randomBytes } from 'node:crypto';
import { and, desc, eq, gt, isNull, sql } from 'drizzle-orm';
import { classes, classMembers, invitations, users } from '../../../../db/schema';
import { config } from '../config';
import { db } from '../db';
import { limits } from '../limits';
import { hitAll } from '../rate-limit';
import type { UserRecord } from '../users';
import type { ClassRecord } from './classes';
import { sendInvitationMail } from './class-mail';

/**
 * Class invitations: an e-mailed link that works once, lasts 14 days and is kept only as the
 * SHA-256 hash of its token. It is for one address (normalised, compared exactly): only the
 * account whose stored address is the invitation's may accept it. Sending a new link for an
 * address, resending or revoking kills the old link.
 */
export const INVITATION_DAYS = 14;

const digest = (token: string) => createHash('sha256').update(token).digest('hex');

export const joinLink = (token: string) => {
  const url = new URL('/classes/join', config().APP_URL);
  url.searchParams.set('token', token);
  return url.toString();
};

export type InviteOutcome = { email: string; status: 'sent' | 'already-member' | 'is-instructor' | 'limited' };

/** Kills every open link for this address in this class (before a new one is sent). */
async function revokeOpenFor(classId: number, email: string) {
  await db()
    .update(invitations)
    .set({ revokedAt: sql`UTC_TIMESTAMP()` })
    .where(and(eq(invitations.classId, classId), eq(invitations.email, email), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)));
}

async function issueAndSend(cls: ClassRecord, inviter: UserRecord, email: string): Promise<void> {
  await revokeOpenFor(cls.id, email);
  const token = randomBytes(32).toString('base64url');
  await db()
    .insert(invitations)
    .values({
      classId: cls.id,
      email,
      tokenHash: digest(token),
      invitedBy: inviter.id,
      expiresAt: new Date(Date.now() + INVITATION_DAYS * 24 * 3600 * 1000),
    });
  await sendInvitationMail(email, {
    className: cls.name,
    term: cls.term,
    instructorName: cls.instructorName ?? 'Your instructor',
    link: joinLink(token),
    days: INVITATION_DAYS,
  });
}

/** Invites each address (already normalised) that isn't in the class yet; one mail each. */
export async function inviteToClass(cls: ClassRecord, inviter: UserRecord, emails: string[]): Promise<InviteOutcome[]> {
  const outcomes: InviteOutcome[] = [];
  for (const email of emails) {
    const [account] = await db().select({ id: users.id }).from(users).where(eq(users.email, email));
    if (account?.id === cls.instructorId) {
      outcomes.push({ email, status: 'is-instructor' });
      continue;
    }
    if (account) {
      const [member] = await db()
        .select({ userId: classMembers.userId })
        .from(classMembers)
        .where(and(eq(classMembers.classId, cls.id), eq(classMembers.userId, account.id)));
      if (member) {
        outcomes.push({ email, status: 'already-member' });
        continue;
      }
    }
    const allowed = await hitAll([
      [limits.invitationsPerInviter, inviter.id],
      [limits.invitationsPerEmail, email],
    ]);
    if (!allowed.allowed) {
      outcomes.push({ email, status: 'limited' });
      continue;
    }
    await issueAndSend(cls, inviter, email);
    outcomes.push({ email, status: 'sent' });
  }
  return outcomes;
}

/** An open invitation of this class by id (for resend and revoke), or undefined. */
async function openInvitationOf(classId: number, invitationId: number) {
  const [row] = await db()
    .select()
    .from(invitations)
    .where(and(eq(invitations.id, invitationId), eq(invitations.classId, classId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)));
  return row;
}

/** Sends a new link in place of an open one (the old link stops working). */
export async function resendInvitation(cls: ClassRecord, inviter: UserRecord, invitationId: number): Promise<'sent' | 'not-found' | 'limited'> {
  const row = await openInvitationOf(cls.id, invitationId);
  if (!row) return 'not-found';
  const allowed = await hitAll([
    [limits.invitationsPerInviter, inviter.id],
    [limits.invitationsPerEmail, row.email],
  ]);
  if (!allowed.allowed) return 'limited';
  await issueAndSend(cls, inviter, row.email);
  return 'sent';
}

export async function revokeInvitation(classId: number, invitationId: number): Promise<boolean> {
  const [result] = await db()
    .update(invitations)
    .set({ revokedAt: sql`UTC_TIMESTAMP()` })
    .where(and(eq(invitations.id, invitationId), eq(invitations.classId, classId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)));
  return result.affectedRows === 1;
}

export interface PendingInvitation {
  id: number;
  email: string;
  expiresAt: Date;
  createdAt: Date;
  expired: boolean;
}

/** The class's open invitations, newest first; expired ones are marked so. */
export async function pendingInvitations(classId: number): Promise<PendingInvitation[]> {
  const rows = await db()
    .select({ id: invitations.id, email: invitations.email, expiresAt: invitations.expiresAt, createdAt: invitations.createdAt })
    .from(invitations)
    .where(and(eq(invitations.classId, classId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
    .orderBy(desc(invitations.createdAt), desc(invitations.id));
  const now = Date.now();
  return rows.map((row) => ({ ...row, expired: row.expiresAt.getTime() <= now }));
}

export type InvitationState = 'open' | 'used' | 'expired' | 'revoked' | 'unknown';

export interface InvitationLookup {
  state: InvitationState;
  invitation?: { id: number; email: string; classId: number; className: string; term: string | null; instructorName: string | null };
}

/** What a link's token names, without using it. */
export async function lookUpInvitation(token: string): Promise<InvitationLookup> {
  const [row] = await db()
    .select({
      id: invitations.id,
      email: invitations.email,
      classId: invitations.classId,
      expiresAt: invitations.expiresAt,
      acceptedAt: invitations.acceptedAt,
      revokedAt: invitations.revokedAt,
      className: classes.name,
      term: classes.term,
      instructorName: users.name,
    })
    .from(invitations)
    .innerJoin(classes, eq(classes.id, invitations.classId))
    .innerJoin(users, eq(users.id, classes.instructorId))
    .where(eq(invitations.tokenHash, digest(token)));
  if (!row) return { state: 'unknown' };
  const invitation = { id: row.id, email: row.email, classId: row.classId, className: row.className, term: row.term, instructorName: row.instructorName };
  if (row.acceptedAt) return { state: 'used', invitation };
  if (row.revokedAt) return { state: 'revoked', invitation };
  if (row.expiresAt.getTime() <= Date.now()) return { state: 'expired', invitation };
  return { state: 'open', invitation };
}

export type Acceptance = { status: 'joined'; classId: number } | { status: 'wrong-account'; email: string } | { status: Exclude<InvitationState, 'open'> };

/**
 * Accepts an invitation for `user`: only if their stored address is exactly the invitation's, and
 * only once. The use is one conditional UPDATE (open, unexpired, unrevoked), so two clicks at once
 * join once; joining is an INSERT IGNORE, so someone already in the class stays as they were.
 */
export async function acceptInvitation(token: string, user: Pick<UserRecord, 'id' | 'email'>): Promise<Acceptance> {
  const found = await lookUpInvitation(token);
  if (found.state !== 'open' || !found.invitation) return { status: found.state === 'open' ? 'unknown' : found.state };
  const invitation = found.invitation;
  if (invitation.email !== user.email) return { status: 'wrong-account', email: invitation.email };
  return db().transaction(async (tx) => {
    const [result] = await tx
      .update(invitations)
      .set({ acceptedAt: sql`UTC_TIMESTAMP()`, acceptedBy: user.id })
      .where(
        and(
          eq(invitations.id, invitation.id),
          eq(invitations.email, user.email),
          isNull(invitations.acceptedAt),
          isNull(invitations.revokedAt),
          gt(invitations.expiresAt, sql`UTC_TIMESTAMP()`),
        ),
      );
    if (result.affectedRows !== 1) {
      const again = await lookUpInvitation(token);
      return { status: again.state === 'open' ? 'used' : again.state } as Acceptance;
    }
    await tx.insert(classMembers).ignore().values({ classId: invitation.classId, userId: user.id, role: 'student' });
    return { status: 'joined', classId: invitation.classId };
  });
}
