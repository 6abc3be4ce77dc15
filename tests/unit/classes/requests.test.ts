import { describe, expect, it } from 'vitest';
import { classInputSchema, inviteSchema, maskEmail, splitAddresses } from '~/lib/classes/requests';

describe('inviteSchema', () => {
  it('takes a pasted list, normalises each address and drops repeats', () => {
    const parsed = inviteSchema.parse({ emails: ' Ann@Forge.test, bob@forge.test;\nann@forge.test ' });
    expect(parsed.emails).toEqual(['ann@forge.test', 'bob@forge.test']);
  });

  it('names the first address it refuses (a Cyrillic “а”, U+0430, looks like a Latin a)', () => {
    const result = inviteSchema.safeParse({ emails: ['bob@forge.test', '\u0430nn@forge.test'] });
    expect(result.success).toBe(false);
    expect(result.error?.issues[0].message).toContain('\u0430nn@forge.test');
  });

  it('refuses an empty list and more than 40 addresses', () => {
    expect(inviteSchema.safeParse({ emails: '  ' }).success).toBe(false);
    expect(inviteSchema.safeParse({ emails: Array.from({ length: 41 }, (_, index) => `s${index}@forge.test`) }).success).toBe(false);
  });

  it('splits on commas, semicolons, spaces and lines', () => {
    expect(splitAddresses('a@x.test,b@x.test; c@x.test\nd@x.test')).toEqual(['a@x.test', 'b@x.test', 'c@x.test', 'd@x.test']);
  });
});

describe('classInputSchema', () => {
  it('keeps a name, makes a blank term and description null', () => {
    expect(classInputSchema.parse({ name: ' Kiln evenings ', term: '', description: '  ' })).toEqual({ name: 'Kiln evenings', term: null, description: null });
  });

  it('refuses a name with a direction override (U+202E)', () => {
    expect(classInputSchema.safeParse({ name: 'Kiln \u202Eevenings' }).success).toBe(false);
  });
});

describe('maskEmail', () => {
  it('shows only the first letter of the mailbox and of the domain, and the top-level domain', () => {
    expect(maskEmail('tamsin@reedbank.test')).toBe('t•••••@r••••••.test');
    expect(maskEmail('a@b.test')).toBe('a••@b••.test');
  });
});
