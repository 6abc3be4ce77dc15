import { createHash, randomBytes } from 'node:crypto';
import { and, eq, isNull, lt, sql } from 'drizzle-orm';
import { accountTokens } from '../../../db/schema';
import { db } from './db';

export type TokenPurpose = (typeof accountTokens.$inferSelect)['purpose'];

export const tokenLifetimes: Record<TokenPurpose, number> = {
  'verify-email': 24 * 3600,
  'reset-password': 3600,
};

const digest = (token: string) => createHash('sha256').update(token).digest('hex');

/** Makes a single-use token for an e-mailed link; only its hash is stored. */
export async function issueToken(userId: string, purpose: TokenPurpose): Promise<string> {
  const token = randomBytes(32).toString('base64url');
  await db()
    .insert(accountTokens)
    .values({ userId, purpose, tokenHash: digest(token), expiresAt: new Date(Date.now() + tokenLifetimes[purpose] * 1000) });
  return token;
}

export type TokenCheck = { status: 'valid'; userId: string } | { status: 'used' | 'expired' | 'unknown' };

/** Uses a token up: valid exactly once, before it expires. The update is atomic, so two clicks can't both win. */
export async function consumeToken(token: string, purpose: TokenPurpose): Promise<TokenCheck> {
  const tokenHash = digest(token);
  const [row] = await db()
    .select()
    .from(accountTokens)
    .where(and(eq(accountTokens.tokenHash, tokenHash), eq(accountTokens.purpose, purpose)));
  if (!row) return { status: 'unknown' };
  if (row.usedAt) return { status: 'used' };
  if (row.expiresAt.getTime() <= Date.now()) return { status: 'expired' };
  const [result] = await db()
    .update(accountTokens)
    .set({ usedAt: sql`UTC_TIMESTAMP(3)` })
    .where(and(eq(accountTokens.id, row.id), isNull(accountTokens.usedAt)));
  if (result.affectedRows !== 1) return { status: 'used' };
  return { status: 'valid', userId: row.userId };
}

/** Tokens of a purpose that are still usable are voided, e.g. older reset links after a reset. */
export async function voidTokens(userId: string, purpose: TokenPurpose): Promise<void> {
  await db()
    .update(accountTokens)
    .set({ usedAt: sql`UTC_TIMESTAMP(3)` })
    .where(and(eq(accountTokens.userId, userId), eq(accountTokens.purpose, purpose), isNull(accountTokens.usedAt)));
}

export async function deleteExpiredTokens(): Promise<void> {
  await db()
    .delete(accountTokens)
    .where(lt(accountTokens.expiresAt, sql`UTC_TIMESTAMP() - INTERVAL 7 DAY`));
}
