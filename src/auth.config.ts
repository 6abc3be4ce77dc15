import { defineConfig } from 'auth-astro';
import Credentials from '@auth/core/providers/credentials';
import Nodemailer from '@auth/core/providers/nodemailer';
import { CredentialsSignin } from '@auth/core/errors';
import { DrizzleAdapter } from '@auth/drizzle-adapter';
import { accounts, sessions, users, verificationTokens } from '../db/schema';
import { db } from './lib/server/db';
import { config } from './lib/server/config';
import { normaliseEmail } from './lib/account';
import { findUserByEmail, findUserById, passwordHashOf } from './lib/server/users';
import { decoyHash, verifyPassword } from './lib/server/passwords';
import { sendNoAccountMail, sendSignInLinkMail } from './lib/server/account-mail';
import { closeSession, findLiveSession, openSession, SESSION_MAX_AGE_SECONDS } from './lib/server/session';
import { consumeSignInLink } from './lib/server/sign-in-links';

class EmailNotConfirmed extends CredentialsSignin {
  code = 'unconfirmed';
}

/**
 * An address the app refuses, typed into the sign-in-link form. Auth.js sends a sign-in error
 * (this kind) back to the sign-in page with its code, where the page says what to fix.
 */
class AddressRefused extends CredentialsSignin {
  code = 'address';
}

/** Auth.js's normalizeIdentifier: the app's own rule, and a refusal (not a guess) for anything else. */
function normaliseIdentifier(identifier: string): string {
  const email = normaliseEmail(identifier);
  if (!email) throw new AddressRefused();
  return email;
}

/** Password sign-in: one answer for an unknown address and a wrong password. */
async function authorize(credentials: Partial<Record<string, unknown>>) {
  const email = normaliseEmail(credentials.email);
  const password = typeof credentials.password === 'string' ? credentials.password : '';
  const user = email ? await findUserByEmail(email) : undefined;
  const hash = user ? await passwordHashOf(user.id) : await decoyHash();
  const matches = (await verifyPassword(hash, password)) && Boolean(user);
  if (!user || !matches) return null;
  if (!user.emailVerified) throw new EmailNotConfirmed();
  return { id: user.id, name: user.name, email: user.email };
}

export default defineConfig({
  secret: config().AUTH_SECRET,
  trustHost: true,
  adapter: {
    ...DrizzleAdapter(db(), {
      usersTable: users,
      accountsTable: accounts,
      sessionsTable: sessions,
      verificationTokensTable: verificationTokens,
    }),
    useVerificationToken: consumeSignInLink,
  },
  session: { strategy: 'jwt', maxAge: SESSION_MAX_AGE_SECONDS },
  pages: { signIn: '/sign-in', verifyRequest: '/sign-in/check-email', error: '/sign-in/problem' },
  providers: [
    Credentials({ credentials: { email: {}, password: {} }, authorize }),
    Nodemailer({
      server: { host: config().SMTP_HOST, port: config().SMTP_PORT, secure: false },
      from: config().MAIL_FROM,
      maxAge: 15 * 60,
      normalizeIdentifier: normaliseIdentifier,
      // The link goes only to an account's address exactly as stored (the identifier is already
      // normalised, and the lookup is exact). Unknown addresses get a "no account here" note
      // instead, so a sign-in link can never create an account and the page shown is the same
      // either way.
      async sendVerificationRequest({ identifier, url }) {
        const user = await findUserByEmail(identifier);
        if (user && user.email === identifier) await sendSignInLinkMail(user.email, url);
        else await sendNoAccountMail(identifier, new URL('/sign-up', url).toString());
      },
    }),
  ],
  callbacks: {
    // A followed sign-in link signs in only the existing account whose stored address is exactly
    // the link's; nothing else (and never a new account).
    async signIn({ user, account, email }) {
      if (account?.provider !== 'nodemailer' || email?.verificationRequest) return true;
      const existing = user.id ? await findUserById(user.id) : undefined;
      return Boolean(existing && existing.email === user.email);
    },
    // A sign-in opens a live session and the cookie carries its id; every later read checks that
    // session (one primary-key read, joined to the user row) and takes the name and role from the
    // database, so sign-out, a password change, a deleted account or a role change act at once.
    async jwt({ token, user }) {
      if (user?.id) {
        const current = await findUserById(user.id);
        if (!current) return null;
        const sid = await openSession(current.id);
        return { ...token, sub: current.id, name: current.name, email: current.email, role: current.role, sid };
      }
      const live = token.sid ? await findLiveSession(token.sid) : undefined;
      if (!live || live.userId !== token.sub) return null;
      return { ...token, name: live.name, email: live.email, role: live.role };
    },
    session({ session, token }) {
      session.user.id = token.sub!;
      session.user.role = token.role;
      return session;
    },
  },
  events: {
    // Auth.js's own sign-out route ends the live session as ours does.
    async signOut(message) {
      const sid = 'token' in message ? message.token?.sid : undefined;
      if (sid) await closeSession(sid);
    },
  },
});
