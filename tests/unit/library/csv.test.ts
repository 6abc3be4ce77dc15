import { describe, expect, it } from 'vitest';
import { csvCell, toCsv } from '~/lib/library/csv';

describe('csvCell', () => {
  // Source: OWASP, "CSV Injection": cells beginning with = + - @ tab (0x09) or carriage return (0x0D) get a leading single quote.
  it.each([
    ['=HYPERLINK("http://x.example","click")', `"'=HYPERLINK(""http://x.example"",""click"")"`],
    ['+1+2', "'+1+2"],
    ['-2+3', "'-2+3"],
    ['@SUM(A1:A2)', "'@SUM(A1:A2)"],
    ['\tcmd', "'\tcmd"],
    ['\rcmd', `"'\rcmd"`],
  ])('neutralises the formula %j', (input, expected) => {
    expect(csvCell(input)).toBe(expected);
  });

  // Source: RFC 4180 §2 rules 5–7: fields with commas, double quotes or line breaks are enclosed in double quotes, inner quotes doubled.
  it.each([
    ['Straw, then bronze', '"Straw, then bronze"'],
    ['the "blue" band', '"the ""blue"" band"'],
    ['two\nlines', '"two\nlines"'],
    ['plain', 'plain'],
    ['', ''],
  ])('quotes %j', (input, expected) => {
    expect(csvCell(input)).toBe(expected);
  });

  it('writes numbers as numbers, negative ones too, and blanks for none', () => {
    expect(csvCell(-12.5)).toBe('-12.5');
    expect(csvCell(540)).toBe('540');
    expect(csvCell(null)).toBe('');
    expect(csvCell(Number.NaN)).toBe('');
  });

  it('ends every record with CRLF (RFC 4180 §2.1)', () => {
    expect(
      toCsv([
        ['a', 1],
        ['=b', null],
      ]),
    ).toBe("a,1\r\n'=b,\r\n");
  });
});
