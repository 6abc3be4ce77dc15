// Prints the colour analysis of a photo as JSON:
//   npm run analyze -- <image> [--region x,y,w,h]... [--grey x,y,w,h] [--k N] [--adaptation rgb-von-kries|bradford]
// Regions are in pixels of the upright (EXIF-rotated) photo; one result per --region, in order;
// with no region, the whole photo. Exit code 2 for bad arguments or a photo that cannot be used.
import { readFile } from 'node:fs/promises';
import { parseArgs } from 'node:util';
import { AnalysisInputError, AnalysisOptionsSchema, type AnalysisOptions, type Region } from '~/lib/analysis';

const USAGE = 'usage: npm run analyze -- <image> [--region x,y,w,h]... [--grey x,y,w,h] [--k N] [--adaptation rgb-von-kries|bradford]';

class UsageError extends Error {}

function parseRegion(text: string, flag: string): Region {
  const parts = text.split(',');
  if (parts.length !== 4 || !parts.every((part) => /^\d+$/.test(part.trim()))) {
    throw new UsageError(`${flag} needs four whole numbers x,y,w,h; got "${text}"`);
  }
  const [x, y, width, height] = parts.map(Number);
  if (width === 0 || height === 0) throw new UsageError(`${flag} ${text}: width and height must be at least 1`);
  return { x, y, width, height };
}

function parseCommandLine(args: string[]): { file: string; options: AnalysisOptions } {
  let parsed;
  try {
    parsed = parseArgs({
      args,
      allowPositionals: true,
      options: {
        region: { type: 'string', multiple: true },
        grey: { type: 'string' },
        k: { type: 'string' },
        adaptation: { type: 'string' },
      },
    });
  } catch (error) {
    throw new UsageError((error as Error).message);
  }
  const { values, positionals } = parsed;
  if (positionals.length !== 1) throw new UsageError(positionals.length ? `one image expected, got ${positionals.length}` : 'no image given');
  const options: AnalysisOptions = { regions: (values.region ?? []).map((text) => parseRegion(text, '--region')) };
  if (values.grey !== undefined) options.grey = parseRegion(values.grey, '--grey');
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
  const checked = AnalysisOptionsSchema.safeParse(options);
  if (!checked.success) throw new UsageError(checked.error.issues[0]?.message ?? 'invalid options');
  return { file: positionals[0], options };
}

async function main(): Promise<number> {
  let file: string;
  let options: AnalysisOptions;
  try {
    ({ file, options } = parseCommandLine(process.argv.slice(2)));
  } catch (error) {
    if (!(error instanceof UsageError)) throw error;
    console.error(`analyze: ${error.message}\n${USAGE}`);
    return 2;
  }
  let buffer: Buffer;
  try {
    buffer = await readFile(file);
  } catch (error) {
    console.error(`analyze: cannot read ${file}: ${(error as NodeJS.ErrnoException).code ?? (error as Error).message}`);
    return 2;
  }
  const { ImageRejected } = await import('~/lib/server/photos/decode');
  const { analysePhoto } = await import('~/lib/server/photos/measure');
  try {
    const analysis = await analysePhoto(buffer, options);
    process.stdout.write(`${JSON.stringify({ file, ...analysis }, null, 2)}\n`);
    return 0;
  } catch (error) {
    if (error instanceof ImageRejected || error instanceof AnalysisInputError) {
      console.error(`analyze: ${file}: ${error.message} (${error.code})`);
      return 2;
    }
    throw error;
  }
}

process.exitCode = await main();
