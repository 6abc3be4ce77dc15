// Photo colour analysis: speed and peak memory on a 24-megapixel JPEG, accuracy on synthetic
// coupons of known colour, side by side with node-vibrant (a general-purpose palette extractor)
// and with the floor, sharp's decode-and-shrink alone.
//
// Each timed case runs in its own child process (this file with --child), so its peak memory is
// that process's own maximum resident set size (process.resourceUsage().maxRSS, which includes
// Node itself); the parent only writes the photos and scores accuracy.
import { spawnSync } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import sharp from 'sharp';
import { converter, differenceCiede2000 } from 'culori';
import { ANALYSIS_LONG_SIDE } from '~/lib/server/photos/decode';
import { analysePhoto } from '~/lib/server/photos/measure';
import type { Region } from '~/lib/analysis';
import { couponScene, encodeJpeg, illuminantACast, illuminantD50Cast, renderScene, TINTS } from '../../tests/fixtures/synthetic-photos';
import { ms, printTable, time, type Timing } from './report';

// Loaded only where used, so the analysis process does not carry node-vibrant's decoder in its memory.
const loadVibrant = async () => (await import('node-vibrant/node')).Vibrant;

const TARGET = { medianMs: 300, peakMb: 400, medianDeltaE: 2, worstDeltaE: 4, batchRatio: 2 };
/** Photos in the timed batch run of `npm run analyze` (copies of the 24 MP file). */
const BATCH_SIZE = 6;
const self = fileURLToPath(import.meta.url);
const root = path.resolve(path.dirname(self), '../..');

type Case = 'analysis' | 'floor' | 'full-decode' | 'vibrant';
interface ChildReport {
  timing: Timing;
  peakMb: number;
}
interface Job {
  file: string;
  regions: Region[];
  grey: Region;
}

async function runChild(which: Case, job: Job): Promise<void> {
  const buffer = readFileSync(job.file);
  const Vibrant = which === 'vibrant' ? await loadVibrant() : undefined;
  const work: Record<Case, () => Promise<unknown>> = {
    analysis: () => analysePhoto(buffer, { regions: job.regions, grey: job.grey }),
    floor: () => sharp(buffer).rotate().resize(ANALYSIS_LONG_SIDE, ANALYSIS_LONG_SIDE, { fit: 'inside' }).raw().toBuffer(),
    'full-decode': () => sharp(buffer).rotate().raw().toBuffer(),
    vibrant: () => Vibrant!.from(buffer).getPalette(),
  };
  const slow = which === 'vibrant';
  const timing = await time(work[which], slow ? 5 : 21, slow ? 1 : 3);
  const report: ChildReport = { timing, peakMb: process.resourceUsage().maxRSS / 1024 };
  process.stdout.write(JSON.stringify(report));
}

function measure(which: Case, job: Job): ChildReport {
  const run = spawnSync(process.execPath, ['--expose-gc', path.join(root, 'node_modules/tsx/dist/cli.mjs'), self, '--child', which, JSON.stringify(job)], {
    cwd: root,
    encoding: 'utf8',
    maxBuffer: 1 << 20,
  });
  if (run.status !== 0) throw new Error(`${which} failed: ${run.stderr}`);
  return JSON.parse(run.stdout) as ChildReport;
}

/** The same folder through a bare sharp decode-and-shrink of each photo in turn (the floor), in a process started the same way. */
async function floorBatch(folder: string): Promise<void> {
  const files = readdirSync(folder).sort();
  for (const file of files)
    await sharp(readFileSync(path.join(folder, file)))
      .rotate()
      .resize(ANALYSIS_LONG_SIDE, ANALYSIS_LONG_SIDE, { fit: 'inside' })
      .raw()
      .toBuffer();
  process.stdout.write(files.map((file) => `${file}\n`).join(''));
}

/**
 * Wall time of `npm run analyze` (through tsx, as a person runs it), or of the floor, over a folder
 * of `count` copies of a photo, the same regions and grey card for each; checks one line came out per photo.
 */
function timeBatch(dir: string, job: Job, count: number, which: 'analyze' | 'floor'): number {
  const folder = path.join(dir, `batch-${count}`);
  if (!existsSync(folder)) {
    mkdirSync(folder);
    for (let i = 0; i < count; i += 1) copyFileSync(job.file, path.join(folder, `photo-${i}.jpg`));
  }
  const flag = (region: Region) => `${region.x},${region.y},${region.width},${region.height}`;
  const tsx = path.join(root, 'node_modules/tsx/dist/cli.mjs');
  const args = which === 'floor' ? [tsx, self, '--floor-batch', folder] : [tsx, path.join(root, 'scripts/analyze.ts'), folder, '--grey', flag(job.grey)];
  if (which === 'analyze') for (const region of job.regions) args.push('--region', flag(region));
  const start = performance.now();
  const run = spawnSync(process.execPath, args, { cwd: root, encoding: 'utf8', maxBuffer: 1 << 24 });
  const elapsed = performance.now() - start;
  if (run.status !== 0 || run.stdout.trim().split('\n').length !== count) throw new Error(`${which} batch failed: ${run.stderr}`);
  return elapsed;
}

const ciede2000 = differenceCiede2000();
const toLab65 = converter('lab65');
const deltaE = (known: string, measured: string | { l: number; a: number; b: number }) =>
  ciede2000(toLab65(known)!, typeof measured === 'string' ? toLab65(measured)! : { mode: 'lab65', ...measured });

interface Coupon {
  name: string;
  daylight: boolean;
  file: string;
  layers: { region: Region; colour: string }[];
  grey: Region;
}

/** Writes a synthetic coupon photo (two layers, grey card, noise, optional cast) as a JPEG. */
async function writeCoupon(
  dir: string,
  name: string,
  width: number,
  height: number,
  layers: [string, string],
  cast?: [number, number, number],
  sigma = 6,
): Promise<Coupon> {
  const coupon = couponScene(width, height, layers, { cast, noise: { sigma, seed: name.length * 7919 + width } });
  const file = path.join(dir, `${name}.jpg`);
  writeFileSync(file, await encodeJpeg(renderScene(coupon.scene), 90));
  return { name, daylight: !cast, file, layers: coupon.layers, grey: coupon.grey };
}

const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
};

async function scoreAccuracy(coupons: Coupon[]) {
  const Vibrant = await loadVibrant();
  const ours: number[] = [];
  const theirs: number[] = [];
  const theirsInDaylight: number[] = [];
  for (const coupon of coupons) {
    const buffer = readFileSync(coupon.file);
    const analysis = await analysePhoto(buffer, { regions: coupon.layers.map((layer) => layer.region), grey: coupon.grey });
    analysis.regions.forEach((region, index) => ours.push(deltaE(coupon.layers[index].colour, region.swatches[0].lab)));
    // node-vibrant sees the whole photo (it has no regions or grey card); each known colour is scored
    // against whichever of its swatches is closest, which favours it.
    const palette = await Vibrant.from(buffer).getPalette();
    const swatches = Object.values(palette).flatMap((swatch) => (swatch ? [swatch.hex] : []));
    for (const layer of coupon.layers) {
      const closest = Math.min(...swatches.map((hex) => deltaE(layer.colour, hex)));
      theirs.push(closest);
      if (coupon.daylight) theirsInDaylight.push(closest);
    }
  }
  return { ours, theirs, theirsInDaylight };
}

async function main() {
  const dir = mkdtempSync(path.join(tmpdir(), 'oxbloom-bench-analysis-'));
  try {
    const large = await writeCoupon(dir, 'coupon-24mp', 6000, 4000, [TINTS.straw, TINTS.purple]);
    const job: Job = { file: large.file, regions: large.layers.map((layer) => layer.region), grey: large.grey };

    const analysis = measure('analysis', job);
    const floor = measure('floor', job);
    const fullDecode = measure('full-decode', job);
    const vibrant = measure('vibrant', job);
    // Per photo in a batch: the extra time of BATCH_SIZE photos over one (start-up cancels), median
    // of five runs (one alone is at the mercy of whatever else the machine runs meanwhile). The floor
    // is timed the same way, each of its runs right beside one of ours, so both see the same machine.
    const batchRuns: number[] = [];
    const floorRuns: number[] = [];
    for (let run = 0; run < 5; run += 1) {
      const runDir = path.join(dir, `run-${run}`);
      mkdirSync(runDir);
      const perPhoto = (which: 'analyze' | 'floor') => (timeBatch(runDir, job, BATCH_SIZE, which) - timeBatch(runDir, job, 1, which)) / (BATCH_SIZE - 1);
      floorRuns.push(perPhoto('floor'));
      batchRuns.push(perPhoto('analyze'));
    }
    const perPhotoInBatch = median(batchRuns);
    const floorInBatch = median(floorRuns);
    const batchRatio = median(batchRuns.map((value, run) => value / floorRuns[run]));
    const inProcessRatio = analysis.timing.median / floor.timing.median;

    const pairs: [string, string][] = [
      [TINTS.straw, TINTS.purple],
      [TINTS.bronze, TINTS.blue],
      [TINTS.purple, TINTS.lightBlue],
      [TINTS.straw, TINTS.bronze],
      [TINTS.blue, TINTS.lightBlue],
    ];
    const casts: [string, [number, number, number] | undefined][] = [
      ['daylight', undefined],
      ['d50', illuminantD50Cast()],
      ['tungsten', illuminantACast()],
    ];
    const coupons = [large];
    for (const [index, pair] of pairs.entries()) {
      for (const [castName, cast] of casts) coupons.push(await writeCoupon(dir, `coupon-${index}-${castName}`, 2400, 1600, pair, cast, 4 + index * 2));
    }
    const accuracy = await scoreAccuracy(coupons);

    const layerCount = accuracy.ours.length;
    const mb = (value: number) => `${value.toFixed(0)} MB`;
    const ourMedian = median(accuracy.ours);
    const ourWorst = Math.max(...accuracy.ours);
    console.log(
      `24 MP JPEG: 6000×4000, ${(readFileSync(large.file).length / 1e6).toFixed(1)} MB; accuracy over ${coupons.length} coupons, ${layerCount} layers (daylight, D50 and illuminant A casts, noise σ 4–12).`,
    );
    printTable([
      {
        what: 'analyse 24 MP JPEG, decode → swatches (median)',
        measured: ms(analysis.timing.median),
        target: `≤ ${TARGET.medianMs} ms`,
        met: analysis.timing.median <= TARGET.medianMs,
      },
      { what: 'analyse 24 MP JPEG (p95)', measured: ms(analysis.timing.p95) },
      { what: 'analyse: peak RSS of its process', measured: mb(analysis.peakMb), target: `≤ ${TARGET.peakMb} MB`, met: analysis.peakMb <= TARGET.peakMb },
      { what: 'floor: sharp decode + shrink-on-load to 1024 px (median)', measured: ms(floor.timing.median) },
      { what: 'floor: peak RSS', measured: mb(floor.peakMb) },
      { what: 'analysis beyond the floor (median)', measured: ms(analysis.timing.median - floor.timing.median) },
      {
        what: 'analysis ÷ floor, same process (median)',
        measured: `${inProcessRatio.toFixed(2)}×`,
        target: `≤ ${TARGET.batchRatio}×`,
        met: inProcessRatio <= TARGET.batchRatio,
      },
      { what: `npm run analyze, folder of ${BATCH_SIZE} × 24 MP: per photo (median of 5)`, measured: ms(perPhotoInBatch) },
      { what: `floor over the same folder, same way: per photo (median of 5)`, measured: ms(floorInBatch) },
      { what: 'npm run analyze batch per photo ÷ in-process floor above', measured: `${(perPhotoInBatch / floor.timing.median).toFixed(2)}×` },
      {
        what: 'npm run analyze batch: per photo ÷ floor beside it (median of 5)',
        measured: `${batchRatio.toFixed(2)}×`,
        target: `≤ ${TARGET.batchRatio}×`,
        met: batchRatio <= TARGET.batchRatio,
      },
      { what: 'sharp decode at full size, 24 MP, no shrink (median)', measured: ms(fullDecode.timing.median) },
      { what: 'sharp decode at full size: peak RSS', measured: mb(fullDecode.peakMb) },
      { what: 'node-vibrant 4.0.4 getPalette, same file (median)', measured: ms(vibrant.timing.median) },
      { what: 'node-vibrant: peak RSS', measured: mb(vibrant.peakMb) },
      { what: 'node-vibrant time ÷ analysis time', measured: `${(vibrant.timing.median / analysis.timing.median).toFixed(1)}×` },
      {
        what: `accuracy ΔE00 median (dominant swatch, ${layerCount} layers)`,
        measured: ourMedian.toFixed(2),
        target: `≤ ${TARGET.medianDeltaE}`,
        met: ourMedian <= TARGET.medianDeltaE,
      },
      { what: 'accuracy ΔE00 worst', measured: ourWorst.toFixed(2), target: `≤ ${TARGET.worstDeltaE}`, met: ourWorst <= TARGET.worstDeltaE },
      { what: 'node-vibrant ΔE00 median (closest of its swatches)', measured: median(accuracy.theirs).toFixed(2) },
      { what: 'node-vibrant ΔE00 worst', measured: Math.max(...accuracy.theirs).toFixed(2) },
      {
        what: 'node-vibrant ΔE00 median / worst, daylight coupons only',
        measured: `${median(accuracy.theirsInDaylight).toFixed(2)} / ${Math.max(...accuracy.theirsInDaylight).toFixed(2)}`,
      },
    ]);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const childAt = process.argv.indexOf('--child');
const floorBatchAt = process.argv.indexOf('--floor-batch');
if (floorBatchAt >= 0) {
  await floorBatch(process.argv[floorBatchAt + 1]);
} else if (childAt >= 0) {
  await runChild(process.argv[childAt + 1] as Case, JSON.parse(process.argv[childAt + 2]) as Job);
} else {
  await main();
}
