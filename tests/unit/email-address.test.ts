import { describe, expect, it } from 'vitest';
import { emailSchema, normaliseEmail } from '~/lib/email-address';

/**
 * The one rule every sign-in route compares e-mail addresses by: trimmed, lower-cased, printable
 * ASCII only, one plain `local@domain` (RFC 5322 §3.4.1 dot-atom), compared exactly afterwards.
 * An address that a case- or accent-folding comparison could confuse with another is refused.
 */
describe('normaliseEmail: accepted, and what it becomes', () => {
  it.each([
    // The stored form of the demo accounts: already normal, unchanged.
    ['member@oxbloom.test', 'member@oxbloom.test'],
    // Surrounding spaces and a newline from a paste are trimmed; ASCII letters are lower-cased.
    // Domains are case-insensitive (RFC 5321 §2.4, RFC 4343); lower-casing the local part too is
    // common practice and the app's rule.
    ['  Member@OxBloom.TEST \n', 'member@oxbloom.test'],
    // A no-break space (U+00A0) is white space to String.prototype.trim (ECMA-262 §12.2): trimmed,
    // and what remains is the plain ASCII address, so nothing can be confused.
    ['member@oxbloom.test\u00a0', 'member@oxbloom.test'],
    // A sub-address is a different mailbox string: kept as it is, never folded into member@.
    ['member+forge@oxbloom.test', 'member+forge@oxbloom.test'],
    // Dots in the local part are kept (RFC 5322 dot-atom); no provider-specific folding.
    ['tamsin.reedbank@oxbloom.test', 'tamsin.reedbank@oxbloom.test'],
    // An apostrophe is an atext character (RFC 5322 §3.2.3) and common in names.
    ["o'hara@oxbloom.test", "o'hara@oxbloom.test"],
    // An internationalised domain written in its ASCII form (RFC 3492 punycode of "prôbe", computed
    // with Node's url.domainToASCII): a domain of its own, compared as itself — never as probe.test.
    ['member@xn--prbe-wqa.test', 'member@xn--prbe-wqa.test'],
  ])('%j → %j', (input, expected) => {
    expect(normaliseEmail(input)).toBe(expected);
    expect(emailSchema.parse(input)).toBe(expected);
  });
});

describe('normaliseEmail: refused', () => {
  it.each([
    // U+00E8 e with grave: an accent-insensitive collation (utf8mb4_unicode_ci) equates mèmber with member.
    ['accented local part', 'mèmber@oxbloom.test'],
    // U+00F4 o with circumflex in the domain: mailed as xn--prbe-wqa.test, a domain anyone may register.
    ['accented domain', 'member@prôbe.test'],
    // U+FF4D FULLWIDTH LATIN SMALL LETTER M: NFKC and the Unicode collation fold it to "m" (UAX #15, UTS #10).
    ['full-width letter', 'ｍember@oxbloom.test'],
    // U+212A KELVIN SIGN lower-cases to ASCII "k" (UnicodeData.txt): refused before lower-casing can hide it.
    ['Kelvin sign', '\u212Aate@oxbloom.test'],
    // U+0130 capital I with dot lower-cases to "i" + U+0307 (SpecialCasing.txt).
    ['dotted capital I', 'İnstructor@oxbloom.test'],
    // U+200B ZERO WIDTH SPACE: invisible in any mail client.
    ['zero-width space', 'mem\u200bber@oxbloom.test'],
    // U+0430 CYRILLIC SMALL LETTER A, a confusable of Latin "a" (UTS #39 confusables.txt).
    ['Cyrillic look-alike', '\u0430dmin@oxbloom.test'],
    // A trailing dot names the DNS root (RFC 1034 §3.1): another string for the same host.
    ['trailing dot', 'member@oxbloom.test.'],
    // A comma makes a list: Nodemailer would mail every address in it.
    ['a list of two', 'member@oxbloom.test,someone@elsewhere.test'],
    ['a space inside', 'member@oxbloom.test someone@elsewhere.test'],
    ['two @ signs', 'member@@oxbloom.test'],
    // Quoted local parts (RFC 5322 §3.4.1) are valid mail but not one of our addresses.
    ['quoted local part', '"member"@oxbloom.test'],
    // Address literals (RFC 5321 §4.1.3) bypass DNS.
    ['address literal', 'member@[127.0.0.1]'],
    ['no domain dot', 'member@oxbloom'],
    // Dot-atom: no leading dot, no two dots in a row (RFC 5322 §3.2.3).
    ['leading dot', '.member@oxbloom.test'],
    ['two dots in a row', 'mem..ber@oxbloom.test'],
    ['no @ at all', 'member.oxbloom.test'],
    ['empty', ''],
    ['only spaces', '   '],
    // The column holds 255 characters (RFC 5321 §4.5.3.1.3 allows a path of 256 octets with <>).
    ['256 characters', `${'a'.repeat(243)}@oxbloom.test`],
  ])('%s: %j', (_why, input) => {
    expect(normaliseEmail(input)).toBeUndefined();
    expect(emailSchema.safeParse(input).success).toBe(false);
  });

  it.each([
    ['a number', 5],
    ['null', null],
    ['nothing', undefined],
    ['an array of addresses', ['member@oxbloom.test']],
  ])('not a string: %s', (_why, input) => {
    expect(normaliseEmail(input)).toBeUndefined();
  });

  it('names the characters it allows when it refuses one', () => {
    const result = emailSchema.safeParse('mèmber@oxbloom.test');
    expect(result.success).toBe(false);
    expect(result.error?.issues[0].message).toMatch(/letters a–z/);
  });

  it('accepts the longest address the column holds (255 characters)', () => {
    const longest = `${'a'.repeat(242)}@oxbloom.test`;
    expect(longest).toHaveLength(255);
    expect(normaliseEmail(longest)).toBe(longest);
  });
});
