// The photo requests' own checks, table-driven; the limits are the issue's (four formats, 30 MB).
import { describe, expect, it } from 'vitest';
import { checkRegions, refuseUpload, regionsSchema, TOO_BIG, UNACCEPTED_TYPE, uploadRequestSchema } from '~/lib/photo-requests';
import { declaredContentType, formatLab, formatShare, kindMismatchMessage, MAX_UPLOAD_BYTES, sameImageKind } from '~/lib/photos';

describe('an upload request', () => {
  it.each([
    // [content type, size, refusal]
    ['image/jpeg', 1, null],
    ['image/heic', MAX_UPLOAD_BYTES, null],
    ['image/jpeg', MAX_UPLOAD_BYTES + 1, { status: 413, message: TOO_BIG, field: 'size' }],
    ['image/gif', 10, { status: 415, message: UNACCEPTED_TYPE, field: 'contentType' }],
    ['application/octet-stream', 10, { status: 415, message: UNACCEPTED_TYPE, field: 'contentType' }],
  ])('%s of %i bytes', (contentType, size, refusal) => {
    expect(refuseUpload(uploadRequestSchema.parse({ filename: 'a', contentType, size }))).toEqual(refusal);
  });

  it('reads the type from the name when the browser gives none (desktop browsers and HEIC)', () => {
    expect(declaredContentType({ name: 'IMG_0042.HEIC', type: '' })).toBe('image/heic');
    expect(declaredContentType({ name: 'coupon.jpeg', type: '' })).toBe('image/jpeg');
    expect(declaredContentType({ name: 'coupon.png', type: 'image/png' })).toBe('image/png');
    expect(declaredContentType({ name: 'notes', type: '' })).toBe('application/octet-stream');
  });
});

describe('the kind of image declared and the kind decoded', () => {
  // Source: IANA media types image/heic and image/heif (registered from ISO/IEC 23008-12, HEIF):
  // HEIC is HEIF with HEVC-coded images, so either label may come with the same file.
  it.each([
    ['image/jpeg', 'image/jpeg', true],
    ['image/heic', 'image/heif', true],
    ['image/heif', 'image/heic', true],
    ['image/png', 'image/jpeg', false],
    ['image/webp', 'image/png', false],
    ['image/heic', 'image/jpeg', false],
  ] as const)('%s decoded, %s declared: same kind %s', (decoded, declared, same) => {
    expect(sameImageKind(decoded, declared)).toBe(same);
  });

  it('names both kinds and the file name the photo should have', () => {
    expect(kindMismatchMessage('image/png', 'image/jpeg')).toBe(
      'This file is a PNG image, but it was declared as JPEG. Give it the right file name (.png) and upload it again.',
    );
    expect(kindMismatchMessage('image/heic', 'image/webp')).toBe(
      'This file is a HEIC image, but it was declared as WebP. Give it the right file name (.heic) and upload it again.',
    );
  });
});

describe('regions', () => {
  const layer = (layerId: number, x = 0) => ({ kind: 'layer' as const, layerId, x, y: 0, width: 10, height: 10 });
  const grey = { kind: 'grey' as const, x: 0, y: 0, width: 10, height: 10 };

  it.each([
    ['one per layer and a grey card', [layer(1), layer(2), grey], null],
    ['none at all', [], null],
    ['a layer twice', [layer(1), layer(1, 20)], 'Mark each layer once.'],
    ['two grey cards', [grey, grey], 'Mark at most one grey card.'],
    // Source: a standard grey card reflects 18 % (common practice); 3–95 % is our range for other cards.
    ['a grey card of 18 %', [{ ...grey, reflectance: 18 }], null],
    ['a grey card of 2 %', [{ ...grey, reflectance: 2 }], 'The grey card reflectance is at least 3 %.'],
    ['a grey card of 120 %', [{ ...grey, reflectance: 120 }], 'The grey card reflectance is at most 95 %.'],
    ['a grey card reflectance as text', [{ ...grey, reflectance: '18' }], 'The grey card reflectance is a number (percent).'],
  ])('%s', (_label, regions, message) => {
    const result = regionsSchema.safeParse(regions);
    expect(result.success ? null : result.error.issues[0].message).toBe(message);
  });

  it('must name the coupon’s own layers and lie inside the photo', () => {
    const size = { width: 100, height: 50 };
    expect(checkRegions([layer(1), grey], [1, 2], size)).toBeNull();
    expect(checkRegions([layer(3)], [1, 2], size)).toEqual({
      field: 'regions.0.layerId',
      message: 'regions.0.layerId: that layer is not part of this coupon.',
    });
    expect(checkRegions([layer(1, 95)], [1], size)).toEqual({
      field: 'regions.0',
      message: 'regions.0: The rectangle reaches outside the photo (100 × 50 pixels).',
    });
  });
});

describe('how swatches are written on a chip', () => {
  it('gives L*a*b* to one decimal with true minus signs, and shares in whole percent', () => {
    expect(formatLab({ l: 52.06, a: -3.449, b: 18 })).toBe('L* 52.1  a* −3.4  b* 18.0');
    expect(formatLab({ l: 40, a: -0.04, b: 0 })).toBe('L* 40.0  a* 0.0  b* 0.0');
    expect(formatShare(0.6249)).toBe('62 %');
  });
});
