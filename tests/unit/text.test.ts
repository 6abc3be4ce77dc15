// The rules for free text (titles, names, notes, file names): one helper, used by every such field.
//
// Sources for the character classes:
// - Unicode Character Database 15.1, UnicodeData.txt: general category Cc (controls) is
//   U+0000–U+001F and U+007F–U+009F; U+FFFD is REPLACEMENT CHARACTER, "used to replace an
//   incoming character whose value is unknown or unrepresentable".
// - UCD PropList.txt, Bidi_Control: U+202A–U+202E (embeddings and overrides) and U+2066–U+2069
//   (isolates), the characters of "Trojan Source" (Boucher & Anderson 2021, CVE-2021-42574).
// - UCD PropList.txt White_Space and DerivedCoreProperties.txt Default_Ignorable_Code_Point
//   (U+00AD, U+115F, U+1160, U+200B–U+200F, U+2060, U+3164, U+FEFF, U+FFA0 among them): characters
//   that show nothing. U+2800 BRAILLE PATTERN BLANK is neither but prints as nothing; refusing it
//   alone is common practice for names, not a standard.
// - Unicode Standard §3.9 (D76, D91): a lone surrogate is not a Unicode scalar value, so it is
//   not text at all.
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { textFault } from '~/lib/text';
import { couponInputSchema } from '~/lib/coupons';
import { nameSchema, signUpSchema } from '~/lib/account';
import { uploadRequestSchema } from '~/lib/photo-requests';

const refusedEverywhere: [string, string][] = [
  ['NUL', 'Straw\u0000 test'],
  ['BEL', 'a\u0007b'],
  ['ESC (a terminal escape)', 'blue\u001b[31m'],
  ['DEL', 'a\u007fb'],
  ['NEL, a C1 control', 'a\u0085b'],
  ['U+FFFD', 'Stra\uFFFD test'],
  ['LRE U+202A', 'a\u202Ab'],
  ['RLE U+202B', 'a\u202Bb'],
  ['PDF U+202C', 'a\u202Cb'],
  ['LRO U+202D', 'a\u202Db'],
  ['RLO U+202E, which shows "fdp.exe" as "exe.pdf"', 'coupon\u202Efdp.exe'],
  ['LRI U+2066', 'a\u2066b'],
  ['RLI U+2067', 'a\u2067b'],
  ['FSI U+2068', 'a\u2068b'],
  ['PDI U+2069', 'a\u2069b'],
  ['a lone high surrogate', 'a\uD800b'],
  ['a lone low surrogate', 'a\uDC00b'],
  ['only a zero-width space', '\u200B'],
  ['only zero-width joiners and non-joiners', '\u200C\u200D\u200C'],
  ['only a word joiner and a BOM', '\u2060\uFEFF'],
  ['only a soft hyphen', '\u00AD'],
  ['only Hangul fillers', '\u3164\u115F\u1160\uFFA0'],
  ['only no-break and ideographic spaces', '\u00A0\u3000'],
  ['only left-to-right marks', '\u200E\u200F'],
  ['only braille blanks', '\u2800\u2800'],
];

const singleLineOnly: [string, string][] = [
  ['a line feed', 'line one\nline two'],
  ['a carriage return and line feed', 'line one\r\nline two'],
  ['a tab', 'grit\t400'],
];

const acceptedEverywhere: [string, string][] = [
  ['plain ASCII', 'Ti-6Al-4V straw test, 540 C'],
  ['degrees and arrows', 'Grade 5 straw → blue at 300 °C'],
  ['accented Latin', 'Brünnhilde Øvergaard-Łęcka'],
  ['CJK', '鍛冶屋の試験片'],
  ['right-to-left script without override characters', 'حداد المعادن'],
  ['an emoji joined by ZWJ (visible, though it holds U+200D)', '👩‍🏭 forge day'],
  ['an emoji with a variation selector', '❤️ blue'],
  ['spaces around visible text', '  straw  '],
];

describe('textFault', () => {
  it.each(refusedEverywhere)('refuses %s on one line and in notes', (_label, text) => {
    expect(textFault(text, 'single')).toEqual(expect.any(String));
    expect(textFault(text, 'multi')).toEqual(expect.any(String));
  });

  it.each(singleLineOnly)('refuses %s on one line, keeps it in notes', (_label, text) => {
    expect(textFault(text, 'single')).toEqual(expect.any(String));
    expect(textFault(text, 'multi')).toBeNull();
  });

  it.each(acceptedEverywhere)('accepts %s', (_label, text) => {
    expect(textFault(text, 'single')).toBeNull();
    expect(textFault(text, 'multi')).toBeNull();
  });

  it('refuses notes made only of line breaks, tabs and invisible characters', () => {
    expect(textFault('\n\t\u200B\r\n', 'multi')).toEqual(expect.any(String));
  });

  it('leaves the empty string to the field (required or optional)', () => {
    expect(textFault('', 'single')).toBeNull();
  });
});

describe('every free-text field uses it', () => {
  const coupon = {
    title: 'Straw test',
    layers: ['ti-grade-2'],
    surfacePrep: 'ground',
    process: 'oven',
    temperatureC: 540,
    temperatureMethod: 'thermocouple',
    holdSeconds: 1800,
    atmosphere: 'other',
    atmosphereNote: 'nitrogen',
    notes: 'first line\nsecond line',
    visibility: 'private',
  };
  const firstIssue = (schema: z.core.$ZodType, value: unknown) => {
    const result = z.safeParse(schema, value);
    return result.success ? undefined : { path: result.error.issues[0].path.join('.'), message: result.error.issues[0].message };
  };

  it('accepts a coupon with multi-line notes', () => {
    expect(firstIssue(couponInputSchema, coupon)).toBeUndefined();
  });

  it.each([
    ['title', '\u202Eevil'],
    ['title', 'two\nlines'],
    ['title', '\u200B\u200B'],
    ['atmosphereNote', 'argon\u0000'],
    ['atmosphereNote', 'a\nb'],
    ['notes', 'garbled \uFFFD'],
    ['notes', 'hidden \u2066order\u2069'],
    ['notes', '\u200B\n\u200B'],
  ])('the coupon %s refuses %j', (field, value) => {
    expect(firstIssue(couponInputSchema, { ...coupon, [field]: value })?.path).toBe(field);
  });

  it.each([['\u202Eevil'], ['two\nlines'], ['\u3164'], ['a\u0007']])('a person’s name refuses %j', (value) => {
    expect(firstIssue(nameSchema, value)).toBeDefined();
    expect(firstIssue(signUpSchema, { name: value, email: 'smith@oxbloom.test', password: 'a long test password' })?.path).toBe('name');
  });

  it.each([['photo\u202Egpj.exe'], ['a\nb.jpg'], ['\u200B']])('an upload’s file name refuses %j', (value) => {
    expect(firstIssue(uploadRequestSchema, { filename: value, contentType: 'image/jpeg', size: 1000 })?.path).toBe('filename');
  });
});
