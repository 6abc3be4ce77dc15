// The OKLab conversion the pixel loop does inline, against culori (a reference implementation of
// Ottosson's OKLab) and against the space's definition.
import { describe, expect, it } from 'vitest';
import { convertLrgbToOklab } from 'culori/fn';
import { writeOklab } from '~/lib/analysis/pixels';
import { seededRandom } from '~/lib/random';

describe('OKLab of linear sRGB, written in place', () => {
  it('gives culori’s numbers to the last bit, over the 8-bit code values and random linear light', () => {
    // Source: culori's convertLrgbToOklab (Ottosson, "A perceptual color space for image processing", 2020).
    const out = new Float64Array(3);
    const random = seededRandom(7);
    const samples: [number, number, number][] = [];
    for (let code = 0; code < 256; code += 5) samples.push([code / 255, ((code * 7) % 256) / 255, ((code * 13) % 256) / 255]);
    for (let i = 0; i < 500; i += 1) samples.push([random() * 1.2, random() * 1.2, random() * 1.2]);
    for (const [r, g, b] of samples) {
      writeOklab(r, g, b, out, 0);
      const reference = convertLrgbToOklab({ r, g, b });
      expect([out[0], out[1], out[2]]).toEqual([reference.l, reference.a, reference.b]);
    }
  });

  it('puts white at L 1 with no chroma and black at 0', () => {
    // Source: Ottosson 2020 — OKLab is normalised so the D65 white of sRGB has L = 1, a = b = 0.
    const out = new Float64Array(6);
    writeOklab(1, 1, 1, out, 0);
    writeOklab(0, 0, 0, out, 3);
    expect(out[0]).toBeCloseTo(1, 6);
    expect(Math.abs(out[1])).toBeLessThan(1e-6);
    expect(Math.abs(out[2])).toBeLessThan(1e-6);
    expect([...out.subarray(3)]).toEqual([0, 0, 0]);
  });
});
