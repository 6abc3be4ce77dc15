// Photos through the server side: decoding with sharp (and heic-decode), EXIF, derived files, refusals.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { crc32 } from 'node:zlib';
import sharp from 'sharp';
import exifr from 'exifr';
import { converter, differenceCiede2000 } from 'culori';
import type { Swatch } from '~/lib/analysis';
import { decodePhoto, ImageRejected, MAX_INPUT_PIXELS } from '~/lib/server/photos/decode';
import { deriveFiles } from '~/lib/server/photos/derived-files';
import { isHeic } from '~/lib/server/photos/heic-worker';
import { analyseDecoded, analysePhoto } from '~/lib/server/photos/measure';
import { couponScene, encodeJpeg, encodePng, illuminantACast, renderScene, TINTS } from '../../fixtures/synthetic-photos';

// ΔE00 per Sharma, Wu & Dalal (2005) on CIELAB D65 per CIE 15 (checked in tests/unit/colour/delta-e.test.ts and conversions.test.ts).
const ciede2000 = differenceCiede2000();
const toLab65 = converter('lab65');
const deltaE = (swatch: Swatch, hex: string) => ciede2000(toLab65(hex)!, { mode: 'lab65', ...swatch.lab });

/** A photo decoded and its files derived, as an upload is before its files are stored. */
async function processPhoto(buffer: Uint8Array) {
  const decoded = await decodePhoto(buffer);
  return { ...decoded, ...(await deriveFiles(decoded)) };
}

let workDir: string;
beforeAll(() => {
  workDir = mkdtempSync(path.join(tmpdir(), 'oxbloom-photo-'));
});
afterAll(() => rmSync(workDir, { recursive: true, force: true }));

/** A 2400×1600 coupon photo: straw and purple layers, grey card, illuminant A cast, noise. */
function warmCoupon() {
  return couponScene(2400, 1600, [TINTS.straw, TINTS.purple], { cast: illuminantACast(), noise: { sigma: 6, seed: 31 } });
}
let warmJpeg: Promise<Buffer> | undefined;
const warmCouponJpeg = () => (warmJpeg ??= encodeJpeg(renderScene(warmCoupon().scene)));

const smallCoupon = () => renderScene(couponScene(480, 320, [TINTS.straw, TINTS.purple], { noise: { sigma: 6, seed: 32 } }).scene);

describe('a JPEG coupon photographed under a warm light', () => {
  // Source: the known layer colours; cast per CIE 15:2004 Table T.3 white points (see the fixture).
  it('gives each layer within ΔE00 2 of its known colour', async () => {
    const { layers, grey } = warmCoupon();
    const jpeg = await warmCouponJpeg();
    const analysis = await analysePhoto(jpeg, { regions: layers.map((layer) => layer.region), grey });
    expect(analysis).toMatchObject({ width: 2400, height: 1600, analysedWidth: 1024, analysedHeight: 683 });
    analysis.regions.forEach((region, index) => {
      expect(region.region).toEqual(layers[index].region);
      expect(deltaE(region.swatches[0], layers[index].colour)).toBeLessThan(2);
    });
    expect(analysis.whiteBalance?.grey).toEqual(grey);
  });

  it('gives the upload route the same numbers as the quick path', async () => {
    const { layers, grey } = warmCoupon();
    const jpeg = await warmCouponJpeg();
    const options = { regions: layers.map((layer) => layer.region), grey };
    const photo = await processPhoto(jpeg);
    expect(analyseDecoded(photo.analysisImage, options)).toEqual(await analysePhoto(jpeg, options));
  });

  // Source: ICC.1 colour management — a JPEG tagged Display P3 stores other code values for the same
  // colour; decoding through its embedded profile must give back the sRGB colour (within ΔE00 2).
  it('honours an embedded Display P3 profile', async () => {
    const tagged = await sharp({ create: { width: 300, height: 200, channels: 3, background: TINTS.blue } })
      .withIccProfile('p3')
      .jpeg({ quality: 95 })
      .toBuffer();
    const stored = await sharp(tagged, { ignoreIcc: true }).raw().toBuffer();
    expect([...stored.subarray(0, 3)]).not.toEqual([0x2f, 0x4f, 0x9a]);
    const [region] = (await analysePhoto(tagged)).regions;
    expect(deltaE(region.swatches[0], TINTS.blue)).toBeLessThan(2);
  });
});

describe('EXIF', () => {
  // Source: CIPA DC-008 (Exif 2.32): ExposureTime in seconds, FNumber, PhotographicSensitivity (ISO),
  // DateTimeOriginal "YYYY:MM:DD HH:MM:SS", OffsetTimeOriginal "±HH:MM", WhiteBalance 0 = auto, 1 = manual.
  async function taggedJpeg() {
    return sharp({ create: { width: 600, height: 400, channels: 3, background: TINTS.bronze } })
      .jpeg()
      .withExif({
        IFD0: { Make: 'Oxbloom', Model: 'Oxbloom Bench Camera', Software: 'coupon-rig' },
        IFD2: {
          DateTimeOriginal: '2024:05:01 14:30:15',
          OffsetTimeOriginal: '+01:00',
          ExposureTime: '1/125',
          FNumber: '56/10',
          ISOSpeedRatings: '200',
          LensModel: 'Bench Macro 60mm',
          WhiteBalance: '1',
        },
        IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '0/1 7/1 0/1' },
      })
      .toBuffer();
  }

  it('reads the known tags back', async () => {
    const photo = await processPhoto(await taggedJpeg());
    expect(photo.exif).toEqual({
      takenAt: '2024-05-01T14:30:15+01:00',
      cameraMake: 'Oxbloom',
      cameraModel: 'Bench Camera',
      lens: 'Bench Macro 60mm',
      exposure: '1/125 s f/5.6 ISO 200',
      whiteBalance: 'manual',
    });
  });

  it('never returns GPS, and the derived WebP files carry no metadata at all', async () => {
    const original = await taggedJpeg();
    expect((await exifr.gps(original)).latitude).toBeCloseTo(51.5, 6); // the input really has a position
    const photo = await processPhoto(original);
    expect(JSON.stringify(photo.exif)).not.toMatch(/gps|latitude|longitude|51\.5/i);
    for (const derived of [photo.display, photo.thumbnail]) {
      const metadata = await sharp(derived.data).metadata();
      expect(metadata.format).toBe('webp');
      expect(metadata.exif).toBeUndefined();
      expect(metadata.xmp).toBeUndefined();
      expect(metadata.icc).toBeUndefined();
      expect(metadata.iptc).toBeUndefined();
      // Source: Google, WebP Container Specification — metadata lives only in EXIF, XMP and ICCP chunks.
      expect(riffChunks(derived.data).filter((chunk) => ['EXIF', 'XMP ', 'ICCP'].includes(chunk))).toEqual([]);
      expect(await exifr.parse(derived.data).catch(() => undefined)).toBeUndefined();
      expect(derived.data.includes('Oxbloom')).toBe(false);
    }
  });

  it('reads nothing, and no error, from a photo without EXIF', async () => {
    const photo = await processPhoto(await encodePng(smallCoupon()));
    expect(photo.exif).toEqual({ takenAt: null, cameraMake: null, cameraModel: null, lens: null, exposure: null, whiteBalance: null });
  });
});

/** The FourCCs of a RIFF file's top-level chunks. */
function riffChunks(data: Buffer): string[] {
  const chunks: string[] = [];
  for (let offset = 12; offset + 8 <= data.length;) {
    chunks.push(data.toString('latin1', offset, offset + 4));
    const size = data.readUInt32LE(offset + 4);
    offset += 8 + size + (size % 2);
  }
  return chunks;
}

describe('EXIF orientation', () => {
  // Source: CIPA DC-008 (Exif 2.32), Orientation = 6: the stored 0th row is the visual right side and the
  // 0th column the visual top, i.e. turn the stored picture 90° clockwise to view it. So a stored 300×200
  // picture, red on its left half and blue on its right, is upright 200×300, red on top, blue below.
  it('turns the photo upright and maps regions in upright pixels', async () => {
    const stored = renderScene({
      width: 300,
      height: 200,
      background: TINTS.bronze,
      patches: [
        { region: { x: 0, y: 0, width: 150, height: 200 }, colour: '#b03030' },
        { region: { x: 150, y: 0, width: 150, height: 200 }, colour: TINTS.blue },
      ],
    });
    const jpeg = await sharp(stored.data, { raw: { width: 300, height: 200, channels: 3 } })
      .jpeg({ quality: 95 })
      .withMetadata({ orientation: 6 })
      .toBuffer();
    const photo = await processPhoto(jpeg);
    expect([photo.width, photo.height]).toEqual([200, 300]);
    expect([photo.display.width, photo.display.height]).toEqual([200, 300]);
    const analysis = await analysePhoto(jpeg, {
      regions: [
        { x: 0, y: 0, width: 200, height: 150 },
        { x: 0, y: 150, width: 200, height: 150 },
      ],
    });
    expect(deltaE(analysis.regions[0].swatches[0], '#b03030')).toBeLessThan(2);
    expect(deltaE(analysis.regions[1].swatches[0], TINTS.blue)).toBeLessThan(2);
    // Read without turning, the first region would be a quarter blue.
    expect(analysis.regions.every((region) => region.swatches[0].share > 0.9)).toBe(true);
  });
});

describe('files that are refused', () => {
  async function expectRejected(buffer: Uint8Array, code: ImageRejected['code']) {
    for (const attempt of [() => processPhoto(buffer), () => analysePhoto(buffer)]) {
      const error = await attempt().catch((caught: unknown) => caught);
      expect(error).toBeInstanceOf(ImageRejected);
      expect((error as ImageRejected).code).toBe(code);
      expect((error as ImageRejected).message.length).toBeGreaterThan(10);
    }
  }

  it('a text file named .jpg', async () => {
    writeFileSync(path.join(workDir, 'notes.jpg'), 'heat 1: 540 °C, 20 min, air\n'.repeat(20));
    await expectRejected(readFileSync(path.join(workDir, 'notes.jpg')), 'not-an-image');
  });

  it('a truncated JPEG', async () => {
    const jpeg = await encodeJpeg(smallCoupon());
    await expectRejected(jpeg.subarray(0, Math.floor(jpeg.length / 2)), 'truncated');
    await expectRejected(jpeg.subarray(0, 300), 'truncated');
  });

  it('a zero-byte file', async () => {
    await expectRejected(new Uint8Array(0), 'empty');
  });

  // Source: PNG (ISO/IEC 15948) IHDR — width and height are the first 8 bytes of its data, followed by a
  // CRC-32 over type and data. A header claiming 12000×10000 (120 MP) is refused before any decoding.
  it('an image over the pixel limit', async () => {
    const png = Buffer.from(
      await sharp({ create: { width: 1, height: 1, channels: 3, background: '#000' } })
        .png()
        .toBuffer(),
    );
    png.writeUInt32BE(12_000, 16);
    png.writeUInt32BE(10_000, 20);
    png.writeUInt32BE(crc32(png.subarray(12, 29)), 29);
    expect((await sharp(png).metadata()).width).toBe(12_000);
    expect(12_000 * 10_000).toBeGreaterThan(MAX_INPUT_PIXELS);
    await expectRejected(png, 'too-many-pixels');
  });

  it('an image format that is not accepted (SVG, GIF)', async () => {
    await expectRejected(Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="40" height="40"><rect width="40" height="40"/></svg>'), 'unsupported');
    await expectRejected(
      await sharp({ create: { width: 8, height: 8, channels: 3, background: '#000' } })
        .gif()
        .toBuffer(),
      'unsupported',
    );
  });
});

const heifEncoder = spawnSync('heif-enc', ['--help']).error ? undefined : 'heif-enc';
if (!heifEncoder) console.warn('Skipping the HEIC test: heif-enc (Debian package libheif-examples) is not installed.');

describe('HEIC from a phone', () => {
  // Source: the known layer colours; the file is real HEVC-coded HEIF made by libheif's heif-enc.
  it.skipIf(!heifEncoder)('is decoded with heic-decode and analysed to the known colours', async () => {
    const { scene, layers } = couponScene(640, 480, [TINTS.lightBlue, TINTS.bronze]);
    const pngPath = path.join(workDir, 'coupon.png');
    const heicPath = path.join(workDir, 'coupon.heic');
    writeFileSync(pngPath, await encodePng(renderScene(scene)));
    execFileSync('heif-enc', ['-q', '90', '-o', heicPath, pngPath]);
    const heic = readFileSync(heicPath);
    expect(isHeic(heic)).toBe(true);
    expect((await sharp(heic).metadata()).compression).toBe('hevc');

    const photo = await processPhoto(heic);
    expect(photo).toMatchObject({ format: 'heic', width: 640, height: 480 });
    expect((await sharp(photo.display.data).metadata()).format).toBe('webp');
    const analysis = analyseDecoded(photo.analysisImage, { regions: layers.map((layer) => layer.region) });
    analysis.regions.forEach((region, index) => expect(deltaE(region.swatches[0], layers[index].colour)).toBeLessThan(2));
  });

  it('tells HEVC HEIF from other files by its ftyp brand', async () => {
    expect(isHeic(await encodeJpeg(smallCoupon()))).toBe(false);
    expect(isHeic(Buffer.from('....ftypavif....mif1miaf', 'latin1'))).toBe(false);
    expect(isHeic(Buffer.from('\0\0\0\x18ftypmif1\0\0\0\0mif1heic', 'latin1'))).toBe(true);
  });
});
