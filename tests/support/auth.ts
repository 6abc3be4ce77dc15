import { api, baseUrl, newJar, type Jar } from './app';
import { linkIn, waitForMail } from './mail';

export const demoPassword = 'oxbloom-demo';
export const demo = {
  member: 'member@oxbloom.test',
  member2: 'member2@oxbloom.test',
  instructor: 'instructor@oxbloom.test',
  admin: 'admin@oxbloom.test',
} as const;

/** Gets Auth.js's CSRF token (and its cookie) into the jar. */
export async function csrfToken(jar: Jar, from?: string): Promise<string> {
  const response = await api('/api/auth/csrf', { jar, from });
  return ((await response.json()) as { csrfToken: string }).csrfToken;
}

/** Posts the password sign-in form the way the sign-in page does; returns the raw response. */
export async function postSignIn(jar: Jar, email: string, password: string, from?: string): Promise<Response> {
  const token = await csrfToken(jar, from);
  return api('/api/auth/callback/credentials', {
    jar,
    from,
    form: { csrfToken: token, email, password, callbackUrl: '/account' },
  });
}

/** A cookie jar signed in as `email`; throws if sign-in fails. */
export async function signedIn(email: string, password = demoPassword, from?: string): Promise<Jar> {
  const jar = newJar();
  const response = await postSignIn(jar, email, password, from);
  if (![...jar.cookies.keys()].some((name) => name.endsWith('authjs.session-token'))) {
    throw new Error(`Sign-in as ${email} failed: ${response.status} ${response.headers.get('location')}`);
  }
  return jar;
}

export const sessionCookie = (jar: Jar) => [...jar.cookies.keys()].find((name) => name.endsWith('authjs.session-token'));

const unique = () => `${Date.now().toString(36)}${Math.random().toString(36).slice(2, 7)}`;
export const newAddress = (domain = 'oxbloom.test') => `smith-${unique()}@${domain}`;

export interface TestAccount {
  id: string;
  email: string;
  password: string;
  /** Signed in by the confirmation link. */
  jar: Jar;
}

/** A client address of its own (TEST-NET-1, RFC 5737), for helpers that would otherwise use up a file's per-address limits. */
export const anotherClientAddress = () => `192.0.2.${1 + Math.floor(Math.random() * 250)}`;

/** Signs up and follows the confirmation link: a fresh confirmed account, signed in. */
export async function confirmedAccount(options: { email?: string; password?: string; from?: string } = {}): Promise<TestAccount> {
  const { email = newAddress(), password = 'a long test password', from = anotherClientAddress() } = options;
  const signUp = await api('/api/account/sign-up', { json: { name: 'Test Smith', email, password }, from });
  if (signUp.status !== 202) throw new Error(`Sign-up as ${email} answered ${signUp.status}`);
  const link = new URL(linkIn(await waitForMail(email, 'Confirm your e-mail'), `${baseUrl}/confirm-email`));
  const jar = newJar();
  const confirmed = await api(link.pathname + link.search, { jar });
  if (confirmed.status !== 200) throw new Error(`Confirming ${email} answered ${confirmed.status}`);
  const me = (await (await api('/api/account', { jar })).json()) as { id: string };
  return { id: me.id, email, password, jar };
}
