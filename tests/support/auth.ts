import { api, newJar, type Jar } from './app';

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
export async function signedIn(email: string, password = demoPassword): Promise<Jar> {
  const jar = newJar();
  const response = await postSignIn(jar, email, password);
  if (![...jar.cookies.keys()].some((name) => name.endsWith('authjs.session-token'))) {
    throw new Error(`Sign-in as ${email} failed: ${response.status} ${response.headers.get('location')}`);
  }
  return jar;
}
