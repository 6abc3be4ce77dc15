// Prints the colour analysis of photos, one JSON line per photo:
//   npm run analyze -- <image or folder>... [--region x,y,w,h]... [--grey x,y,w,h] [--grey-reflectance %]
//                      [--k N] [--adaptation rgb-von-kries|bradford] [--alloy <slug>]
// Regions are in pixels of the upright (EXIF-rotated) photo and apply to every photo given; one
// result per --region, in order; with no region, the whole photo. A folder stands for the photos in
// it (JPEG, PNG, WebP, HEIC; not its subfolders). With --alloy, each region also gets the oxide films
// its dominant colour can be, as the coupon page shows them. A photo that cannot be used is named on
// stderr and the rest are still analysed; the exit code is then 2, as it is for bad arguments.
import { readdir, readFile, stat } from 'node:fs/promises';
import path from 'node:path';
import { parseArgs } from 'node:util';
import { AnalysisInputError, AnalysisOptionsSchema, GreyReflectanceSchema, type AnalysisOptions, type Region } from '~/lib/analysis';
import { DOWN_WEIGHTED_NOTE, filmCandidates } from '~/lib/photo-tints';
import { findTintModel } from '~/lib/tint';

const USAGE =
  'usage: npm run analyze -- <image or folder>... [--region x,y,w,h]... [--grey x,y,w,h] [--grey-reflectance %] [--k N] ' +
  '[--adaptation rgb-von-kries|bradford] [--alloy <slug>]';

const PHOTO_EXTENSIONS = new Set(['.jpg', '.jpeg', '.png', '.webp', '.heic', '.heif']);

class UsageError extends Error {}

interface CommandLine {
  inputs: string[];
  options: AnalysisOptions;
  alloy?: string;
}

function parseRegion(text: string, flag: string): Region {
  const parts = text.split(',');
  if (parts.length !== 4 || !parts.every((part) => /^\d+$/.test(part.trim()))) {
    throw new UsageError(`${flag} needs four whole numbers x,y,w,h; got "${text}"`);
  }
  const [x, y, width, height] = parts.map(Number);
  if (width === 0 || height === 0) throw new UsageError(`${flag} ${text}: width and height must be at least 1`);
  return { x, y, width, height };
}

function parseCommandLine(args: string[]): CommandLine {
  let parsed;
  try {
    parsed = parseArgs({
      args,
      allowPositionals: true,
      options: {
        region: { type: 'string', multiple: true },
        grey: { type: 'string' },
        'grey-reflectance': { type: 'string' },
        k: { type: 'string' },
        adaptation: { type: 'string' },
        alloy: { type: 'string' },
      },
    });
  } catch (error) {
    throw new UsageError((error as Error).message);
  }
  const { values, positionals } = parsed;
  if (positionals.length === 0) throw new UsageError('no image given');
  const options: AnalysisOptions = { regions: (values.region ?? []).map((text) => parseRegion(text, '--region')) };
  if (values.grey !== undefined) options.grey = parseRegion(values.grey, '--grey');
  if (values['grey-reflectance'] !== undefined) {
    if (values.grey === undefined) throw new UsageError('--grey-reflectance needs --grey (the card it describes)');
    const reflectance = GreyReflectanceSchema.safeParse(/^\d+(\.\d+)?$/.test(values['grey-reflectance']) ? Number(values['grey-reflectance']) : NaN);
    if (!reflectance.success) throw new UsageError(`--grey-reflectance must be a percentage from 3 to 95; got "${values['grey-reflectance']}"`);
    options.greyReflectance = reflectance.data;
  }
  if (values.k !== undefined) {
    if (!/^[1-5]$/.test(values.k)) throw new UsageError(`--k must be a whole number from 1 to 5; got "${values.k}"`);
    options.k = Number(values.k);
  }
  if (values.adaptation !== undefined) {
    if (values.adaptation !== 'rgb-von-kries' && values.adaptation !== 'bradford') {
      throw new UsageError(`--adaptation must be rgb-von-kries or bradford; got "${values.adaptation}"`);
    }
    options.adaptation = values.adaptation;
  }
  if (values.alloy !== undefined) {
    const model = findTintModel(values.alloy);
    if (!model) throw new UsageError(`--alloy: no alloy "${values.alloy}" in the catalogue`);
    if (!model.optics) throw new UsageError(`--alloy ${values.alloy}: there is no oxide-film model for this alloy, so no film can be read from a colour`);
  }
  const checked = AnalysisOptionsSchema.safeParse(options);
  if (!checked.success) throw new UsageError(checked.error.issues[0]?.message ?? 'invalid options');
  return { inputs: positionals, options, alloy: values.alloy };
}

/** The photos named: files as given, folders as the photos directly in them (by name). */
async function photoFiles(inputs: string[]): Promise<{ files: string[]; unreadable: string[] }> {
  const files: string[] = [];
  const unreadable: string[] = [];
  for (const input of inputs) {
    const info = await stat(input).catch(() => undefined);
    if (!info?.isDirectory()) {
      files.push(input);
      continue;
    }
    try {
      const entries = await readdir(input, { withFileTypes: true });
      const photos = entries.filter((entry) => entry.isFile() && PHOTO_EXTENSIONS.has(path.extname(entry.name).toLowerCase()));
      files.push(...photos.map((entry) => path.join(input, entry.name)).sort());
    } catch {
      unreadable.push(input);
    }
  }
  return { files, unreadable };
}

/**
 * Photos read and decoded ahead of the one being measured. Two keep both cores busy while this thread
 * measures (a decode is mostly one thread of libjpeg); each holds the decoded part of one photo.
 */
const DECODE_AHEAD = 2;

async function main(): Promise<number> {
  let command: CommandLine;
  try {
    command = parseCommandLine(process.argv.slice(2));
  } catch (error) {
    if (!(error instanceof UsageError)) throw error;
    console.error(`analyze: ${error.message}\n${USAGE}`);
    return 2;
  }
  const { ImageRejected } = await import('~/lib/server/photos/decode');
  const { analyseDecoded, decodeToMeasure } = await import('~/lib/server/photos/measure');
  const { files, unreadable } = await photoFiles(command.inputs);
  let failed = unreadable.length > 0;
  for (const folder of unreadable) console.error(`analyze: cannot read the folder ${folder}`);

  // The next photos are read and decoded (in sharp's threads, on the other core) while this one is
  // measured. Each outcome is caught at once, so a bad photo waits its turn to be reported.
  const load = (file: string) =>
    readFile(file).then(
      (buffer) =>
        decodeToMeasure(buffer, command.options).then(
          (image) => ({ image }),
          (error: unknown) => ({ error }),
        ),
      (error: NodeJS.ErrnoException) => ({ unread: error }),
    );
  const ahead = files.slice(0, DECODE_AHEAD).map(load);
  for (const [index, file] of files.entries()) {
    const loaded = await ahead.shift()!;
    if (index + DECODE_AHEAD < files.length) ahead.push(load(files[index + DECODE_AHEAD]));
    if ('unread' in loaded) {
      console.error(`analyze: cannot read ${file}: ${loaded.unread.code ?? loaded.unread.message}`);
      failed = true;
      continue;
    }
    try {
      if ('error' in loaded) throw loaded.error;
      const analysis = analyseDecoded(loaded.image, command.options);
      const regions = command.alloy
        ? analysis.regions.map((region) => ({ ...region, film: filmOf(command.alloy!, region.swatches[0]?.lab, analysis.whiteBalance !== null) }))
        : analysis.regions;
      process.stdout.write(`${JSON.stringify({ file, ...analysis, regions })}\n`);
    } catch (error) {
      if (!(error instanceof ImageRejected || error instanceof AnalysisInputError)) throw error;
      console.error(`analyze: ${file}: ${error.message} (${error.code})`);
      failed = true;
    }
  }
  return failed ? 2 : 0;
}

/** The films a region's dominant colour can be on the alloy; lightness counts half without a grey card. */
function filmOf(alloy: string, lab: { l: number; a: number; b: number } | undefined, exposed: boolean) {
  const lightness = exposed ? 'absolute' : 'down-weighted';
  const candidates = lab ? filmCandidates(alloy, lab, lightness) : [];
  return { alloy, lightness, ...(exposed ? {} : { note: DOWN_WEIGHTED_NOTE }), candidates };
}

process.exitCode = await main();
