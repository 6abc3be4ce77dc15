import { defineConfig } from 'auth-astro';
import Credentials from '@auth/core/providers/credentials';
import Nodemailer from '@auth/core/providers/nodemailer';
import { CredentialsSignin } from '@auth/core/errors';
import { DrizzleAdapter } from '@auth/drizzle-adapter';
import { accounts, sessions, users, verificationTokens } from '../db/schema';
import { db } from './lib/server/db';
import { config } from './lib/server/config';
import { emailSchema } from './lib/account';
import { findUserByEmail, findUserById, passwordHashOf } from './lib/server/users';
import { decoyHash, verifyPassword } from './lib/server/passwords';
import { sendNoAccountMail, sendSignInLinkMail } from './lib/server/account-mail';
import { SESSION_MAX_AGE_SECONDS } from './lib/server/session';

class EmailNotConfirmed extends CredentialsSignin {
  code = 'unconfirmed';
}

/** Password sign-in: one answer for an unknown address and a wrong password. */
async function authorize(credentials: Partial<Record<string, unknown>>) {
  const email = emailSchema.safeParse(credentials.email);
  const password = typeof credentials.password === 'string' ? credentials.password : '';
  const user = email.success ? await findUserByEmail(email.data) : undefined;
  const hash = user ? await passwordHashOf(user.id) : await decoyHash();
  const matches = (await verifyPassword(hash, password)) && Boolean(user);
  if (!user || !matches) return null;
  if (!user.emailVerified) throw new EmailNotConfirmed();
  return { id: user.id, name: user.name, email: user.email };
}

export default defineConfig({
  secret: process.env.AUTH_SECRET,
  trustHost: true,
  adapter: DrizzleAdapter(db(), {
    usersTable: users,
    accountsTable: accounts,
    sessionsTable: sessions,
    verificationTokensTable: verificationTokens,
  }),
  session: { strategy: 'jwt', maxAge: SESSION_MAX_AGE_SECONDS },
  pages: { signIn: '/sign-in', verifyRequest: '/sign-in/check-email', error: '/sign-in/problem' },
  providers: [
    Credentials({ credentials: { email: {}, password: {} }, authorize }),
    Nodemailer({
      server: { host: config().SMTP_HOST, port: config().SMTP_PORT, secure: false },
      from: config().MAIL_FROM,
      maxAge: 15 * 60,
      // Unknown addresses get a "no account here" note instead of a link, so a sign-in link can
      // never create an account and the page shown is the same either way.
      async sendVerificationRequest({ identifier, url }) {
        const user = await findUserByEmail(identifier);
        if (user) await sendSignInLinkMail(identifier, url);
        else await sendNoAccountMail(identifier, new URL('/sign-up', url).toString());
      },
    }),
  ],
  callbacks: {
    // The role is read from the database on every session read, so a role change or a deleted
    // account takes effect at once; anything that changes data checks the database again anyway.
    async jwt({ token, user }) {
      const id = user?.id ?? token.sub;
      const current = id ? await findUserById(id) : undefined;
      if (!current) return null;
      return { ...token, sub: current.id, name: current.name, email: current.email, role: current.role };
    },
    session({ session, token }) {
      session.user.id = token.sub!;
      session.user.role = token.role;
      return session;
    },
  },
});
