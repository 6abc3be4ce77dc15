import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { woffToSfnt } from '~/lib/server/sheets/woff';

const require = createRequire(import.meta.url);

/** The OpenType table checksum: the sum of the table's big-endian uint32s, modulo 2^32. */
function tableChecksum(data: Buffer, isHead: boolean): number {
  const padded = Buffer.alloc((data.length + 3) & ~3);
  data.copy(padded);
  // Source: OpenType spec, "Calculating checksums": the head table is summed with checksumAdjustment (offset 8) as 0.
  if (isHead) padded.writeUInt32BE(0, 8);
  let sum = 0;
  for (let at = 0; at < padded.length; at += 4) sum = (sum + padded.readUInt32BE(at)) >>> 0;
  return sum;
}

describe('unpacking a WOFF font', () => {
  it('gives an sfnt whose every table matches the checksum the WOFF recorded for it', () => {
    const sfnt = woffToSfnt(readFileSync(require.resolve('@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-400-normal.woff')));
    // Source: OpenType spec, table directory: sfntVersion 0x00010000 (TrueType outlines), numTables, then 16-byte records.
    expect(sfnt.readUInt32BE(0)).toBe(0x00010000);
    const numTables = sfnt.readUInt16BE(4);
    expect(numTables).toBeGreaterThan(5);
    const tags: string[] = [];
    for (let index = 0; index < numTables; index++) {
      const record = 12 + index * 16;
      const tag = sfnt.toString('latin1', record, record + 4);
      tags.push(tag);
      const offset = sfnt.readUInt32BE(record + 8);
      const length = sfnt.readUInt32BE(record + 12);
      expect(offset % 4, tag).toBe(0);
      expect(tableChecksum(sfnt.subarray(offset, offset + length), tag === 'head'), tag).toBe(sfnt.readUInt32BE(record + 4));
    }
    expect(tags).toEqual(expect.arrayContaining(['cmap', 'glyf', 'head', 'hmtx', 'name']));
  });

  it('refuses what is not WOFF', () => {
    expect(() => woffToSfnt(Buffer.from('not a font at all, no no no no no no no no no no'))).toThrow(/WOFF/);
  });
});
