// The analyze command, run as a user would: through tsx, on a synthetic photo written to disk.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { converter, differenceCiede2000 } from 'culori';
import type { PhotoAnalysis } from '~/lib/server/photos/measure';
import { couponScene, encodeJpeg, illuminantACast, renderScene, TINTS } from '../../fixtures/synthetic-photos';

const root = path.resolve(import.meta.dirname, '../../..');
const ciede2000 = differenceCiede2000();
const toLab65 = converter('lab65');

function analyze(...args: string[]) {
  const run = spawnSync(process.execPath, [path.join(root, 'node_modules/tsx/dist/cli.mjs'), path.join(root, 'scripts/analyze.ts'), ...args], {
    cwd: root,
    encoding: 'utf8',
  });
  return { status: run.status, stdout: run.stdout, stderr: run.stderr };
}

let workDir: string;
let photoPath: string;
const { scene, layers, grey } = couponScene(1500, 1000, [TINTS.bronze, TINTS.lightBlue], { cast: illuminantACast(), noise: { sigma: 5, seed: 41 } });
const flag = (region: { x: number; y: number; width: number; height: number }) => `${region.x},${region.y},${region.width},${region.height}`;

beforeAll(async () => {
  workDir = mkdtempSync(path.join(tmpdir(), 'oxbloom-cli-'));
  photoPath = path.join(workDir, 'coupon.jpg');
  writeFileSync(photoPath, await encodeJpeg(renderScene(scene)));
});
afterAll(() => rmSync(workDir, { recursive: true, force: true }));

describe('npm run analyze', () => {
  // Source: the known layer colours, ΔE00 per Sharma et al. (2005) on CIELAB D65 (CIE 15).
  it('prints one swatch list per --region, in order, white-balanced from --grey', () => {
    const run = analyze(photoPath, '--region', flag(layers[1].region), '--region', flag(layers[0].region), '--grey', flag(grey));
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    const result = JSON.parse(run.stdout) as PhotoAnalysis & { file: string };
    expect(result).toMatchObject({ file: photoPath, width: 1500, height: 1000 });
    expect(result.regions.map((region) => region.region)).toEqual([layers[1].region, layers[0].region]);
    const expected = [layers[1].colour, layers[0].colour];
    result.regions.forEach((region, index) => {
      expect(ciede2000(toLab65(expected[index])!, { mode: 'lab65', ...region.swatches[0].lab })).toBeLessThan(2);
    });
  });

  it('analyses the whole photo without regions and honours --k', () => {
    const run = analyze(photoPath, '--k', '2');
    expect(run.status).toBe(0);
    const result = JSON.parse(run.stdout) as PhotoAnalysis;
    expect(result.regions).toHaveLength(1);
    expect(result.regions[0].region).toEqual({ x: 0, y: 0, width: 1500, height: 1000 });
    expect(result.regions[0].swatches).toHaveLength(2);
  });

  it.each([
    ['no image', []],
    ['a bad region', ['PHOTO', '--region', '10,10,5']],
    ['k out of range', ['PHOTO', '--k', '6']],
    ['a missing file', ['/nonexistent/coupon.jpg']],
  ])('exits 2 with a message for %s', (_name, args) => {
    const run = analyze(...args.map((arg) => (arg === 'PHOTO' ? photoPath : arg)));
    expect(run.status).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr).toMatch(/^analyze: /);
  });

  it('exits 2 for a file that is not an image, and for a region outside the photo', () => {
    const textPath = path.join(workDir, 'notes.jpg');
    writeFileSync(textPath, 'not a photo\n');
    const notImage = analyze(textPath);
    expect(notImage.status).toBe(2);
    expect(notImage.stderr).toContain('not-an-image');
    const outside = analyze(photoPath, '--region', '2000,2000,10,10');
    expect(outside.status).toBe(2);
    expect(outside.stderr).toContain('region-outside-image');
  });
});
