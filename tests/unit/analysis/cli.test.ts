// The analyze command, run as a user would: through tsx, on a synthetic photo written to disk.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { converter, differenceCiede2000 } from 'culori';
import type { PhotoAnalysis } from '~/lib/server/photos/measure';
import { couponScene, encodeJpeg, encodePng, illuminantACast, renderScene, TINTS } from '../../fixtures/synthetic-photos';
import { linearToHex, titaniumFilmSpectrum, tristimulus, xyzToLinearRgb } from './film-spectra';

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
let filmPath: string;
let folder: string;
/** A titanium film of known thickness (colour from the independent computation in film-spectra.ts), beside a grey card. */
const FILM_NM = 110;
const filmXyz = tristimulus(titaniumFilmSpectrum(FILM_NM));
const film = couponScene(900, 600, [linearToHex(xyzToLinearRgb(filmXyz)).hex, TINTS.straw], { noise: { sigma: 3, seed: 4 } });
const { scene, layers, grey } = couponScene(1500, 1000, [TINTS.bronze, TINTS.lightBlue], { cast: illuminantACast(), noise: { sigma: 5, seed: 41 } });
const flag = (region: { x: number; y: number; width: number; height: number }) => `${region.x},${region.y},${region.width},${region.height}`;

beforeAll(async () => {
  workDir = mkdtempSync(path.join(tmpdir(), 'oxbloom-cli-'));
  photoPath = path.join(workDir, 'coupon.jpg');
  writeFileSync(photoPath, await encodeJpeg(renderScene(scene)));
  filmPath = path.join(workDir, 'film.png');
  writeFileSync(filmPath, await encodePng(renderScene(film.scene)));
  folder = path.join(workDir, 'folder');
  mkdirSync(folder);
  writeFileSync(path.join(folder, 'b.png'), await encodePng(renderScene(film.scene)));
  writeFileSync(path.join(folder, 'a.JPG'), await encodeJpeg(renderScene(scene)));
  writeFileSync(path.join(folder, 'notes.txt'), 'not a photo\n');
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

  it('analyses many photos in one run, files and folders, one JSON line per photo in order', () => {
    const run = analyze(photoPath, folder, filmPath, '--k', '1');
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    const lines = run.stdout.trimEnd().split('\n');
    // Source: construction — one file, a folder of two photos (by name; its text file is no photo), one file.
    expect(lines.map((line) => (JSON.parse(line) as { file: string }).file)).toEqual([
      photoPath,
      path.join(folder, 'a.JPG'),
      path.join(folder, 'b.png'),
      filmPath,
    ]);
  });

  it('goes on past a photo it cannot use, names it, and exits 2', () => {
    const textPath = path.join(workDir, 'broken.jpg');
    writeFileSync(textPath, 'not a photo\n');
    const run = analyze(photoPath, textPath, filmPath);
    expect(run.status).toBe(2);
    expect(run.stdout.trimEnd().split('\n')).toHaveLength(2);
    expect(run.stderr).toContain(`${textPath}: `);
    expect(run.stderr).toContain('not-an-image');
  });

  describe('--alloy', () => {
    const filmOf = (stdout: string) =>
      (
        JSON.parse(stdout) as {
          regions: { film: { lightness: string; note?: string; candidates: { thicknessNm: number; name: string; deltaE00: number }[] } }[];
        }
      ).regions[0].film;

    it('lists the films the dominant colour can be, best first, every order that fits', () => {
      const run = analyze(filmPath, '--region', flag(film.layers[0].region), '--grey', flag(film.grey), '--alloy', 'ti-grade-2');
      expect(run.stderr).toBe('');
      expect(run.status).toBe(0);
      const { lightness, note, candidates } = filmOf(run.stdout);
      expect(lightness).toBe('absolute');
      expect(note).toBeUndefined();
      // Source: the film's thickness, 110 nm (tolerance ±6 nm as in exposure.test.ts).
      expect(Math.abs(candidates[0].thicknessNm - FILM_NM)).toBeLessThanOrEqual(6);
      expect(candidates[0].deltaE00).toBeLessThan(3);
      expect(candidates.length).toBeGreaterThan(1);
      for (const [index, candidate] of candidates.entries()) {
        expect(Object.keys(candidate).sort()).toEqual(['deltaE00', 'name', 'thicknessNm']);
        if (index > 0) expect(candidate.deltaE00).toBeGreaterThanOrEqual(candidates[index - 1].deltaE00);
      }
      // Each a different interference order: no two within 4 nm of each other.
      const thicknesses = candidates.map((candidate) => candidate.thicknessNm).sort((a, b) => a - b);
      thicknesses.slice(1).forEach((thickness, index) => expect(thickness - thicknesses[index]).toBeGreaterThan(4));
    });

    it('without a grey card, weighs lightness down and says so beside the films', () => {
      const run = analyze(filmPath, '--region', flag(film.layers[0].region), '--alloy', 'ti-grade-2');
      expect(run.status).toBe(0);
      const { lightness, note, candidates } = filmOf(run.stdout);
      expect(lightness).toBe('down-weighted');
      expect(note).toMatch(/kL = 2/);
      expect(candidates.length).toBeGreaterThan(0);
      // Source: the photo is exposed right, so the film (110 nm) reads true either way.
      expect(Math.abs(candidates[0].thicknessNm - FILM_NM)).toBeLessThanOrEqual(6);
    });

    it.each([
      ['an unknown alloy', ['--alloy', 'unobtainium']],
      ['a reflectance without a card', ['--grey-reflectance', '18']],
      ['a reflectance out of range', ['--grey', '0,0,10,10', '--grey-reflectance', '120']],
    ])('exits 2 for %s', (_name, args) => {
      const run = analyze(filmPath, ...args);
      expect(run.status).toBe(2);
      expect(run.stdout).toBe('');
      expect(run.stderr).toMatch(/^analyze: /);
    });
  });
});
