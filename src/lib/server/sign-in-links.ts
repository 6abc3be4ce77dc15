import { and, eq } from 'drizzle-orm';
import { verificationTokens } from '../../../db/schema';
import { db } from './db';

export interface SignInLinkToken {
  identifier: string;
  token: string;
  expires: Date;
}

/**
 * Uses up an e-mailed sign-in link's token (Auth.js's `useVerificationToken`), for the address it
 * was made for only. The delete decides: of two requests with one link at the same moment, only
 * the one whose delete removed the row signs in. (The Drizzle adapter's own version reads, then
 * deletes, and lets both through.)
 */
export async function consumeSignInLink(params: { identifier: string; token: string }): Promise<SignInLinkToken | null> {
  if (typeof params.identifier !== 'string' || typeof params.token !== 'string') return null;
  const match = and(eq(verificationTokens.identifier, params.identifier), eq(verificationTokens.token, params.token));
  const [row] = await db().select().from(verificationTokens).where(match);
  if (!row) return null;
  const [result] = await db().delete(verificationTokens).where(match);
  return result.affectedRows === 1 ? row : null;
}
