import { describe, expect, it } from 'vitest';
import { ConfigError, LOCAL_DATABASE_URL, readConfig } from '~/lib/server/config';

const secret = 'x'.repeat(43);

describe('the server settings', () => {
  it('fill in the local services when only the secret is given', () => {
    const settings = readConfig({ AUTH_SECRET: secret });
    expect(settings.DATABASE_URL).toBe(LOCAL_DATABASE_URL);
    expect(settings.TRUST_PROXY).toBe(false);
    expect(settings.OXBLOOM_LIMIT_PER_ADDRESS).toBeUndefined();
  });

  it('read the proxy switch and the per-address limit as their types', () => {
    const settings = readConfig({ AUTH_SECRET: secret, TRUST_PROXY: '1', OXBLOOM_LIMIT_PER_ADDRESS: '500' });
    expect(settings.TRUST_PROXY).toBe(true);
    expect(settings.OXBLOOM_LIMIT_PER_ADDRESS).toBe(500);
  });

  // Each case: what is wrong, and the words the one-line message must carry.
  it.each([
    [{}, 'AUTH_SECRET is not set'],
    [{ AUTH_SECRET: 'short' }, 'AUTH_SECRET must be at least 32 characters'],
    [{ AUTH_SECRET: secret, TRUST_PROXY: 'yes' }, 'TRUST_PROXY must be 0 or 1'],
    [{ AUTH_SECRET: secret, DATABASE_URL: 'postgres://db/oxbloom' }, 'DATABASE_URL'],
    [{ AUTH_SECRET: secret, SMTP_PORT: 'twenty-five' }, 'SMTP_PORT'],
  ])('refuse %o, naming the setting', (environment, words) => {
    expect(() => readConfig(environment)).toThrow(ConfigError);
    expect(() => readConfig(environment)).toThrow(words);
  });
});
