import { createRequire } from 'node:module';
import { Worker } from 'node:worker_threads';

/**
 * HEIC photos (HEVC-coded HEIF, what many phones save): sharp's prebuilt binaries read their
 * header but cannot decode HEVC, so these are decoded with heic-decode (libheif in WebAssembly).
 */

/** ISO-BMFF brands that mean HEVC-coded HEIF (per the HEIF standard, ISO/IEC 23008-12). */
const HEVC_BRANDS = new Set(['heic', 'heix', 'heim', 'heis', 'hevc', 'hevx', 'hevm', 'hevs']);

/** True when the buffer starts with an ISO-BMFF `ftyp` box naming an HEVC brand (AVIF and others are left to sharp). */
export function isHeic(buffer: Uint8Array): boolean {
  if (buffer.length < 16) return false;
  const text = (start: number) => String.fromCharCode(...buffer.subarray(start, start + 4));
  if (text(4) !== 'ftyp') return false;
  const boxSize = Math.min(buffer.length, new DataView(buffer.buffer, buffer.byteOffset).getUint32(0));
  const brands = [text(8)];
  for (let offset = 16; offset + 4 <= boxSize; offset += 4) brands.push(text(offset));
  return brands.some((brand) => HEVC_BRANDS.has(brand));
}

export interface DecodedHeic {
  width: number;
  height: number;
  /** RGBA, 8 bits per channel, already turned upright by the file's own rotation/mirror properties. */
  data: Uint8ClampedArray;
}

/**
 * heic-decode runs libheif in WebAssembly on the calling thread: about a second for a 12 MP photo.
 * So decoding happens in one worker thread per process, and the event loop keeps serving meanwhile.
 * The worker is plain CommonJS given as source (nothing for the bundler to miss) and loads
 * heic-decode from the path resolved here.
 */
const WORKER_SOURCE = `
const { parentPort, workerData } = require('node:worker_threads');
const { all } = require(workerData.decoderPath);
parentPort.on('message', async ({ id, buffer, maxPixels }) => {
  try {
    const images = await all({ buffer });
    try {
      const primary = images[0];
      if (!primary) throw new Error('no image in the file');
      if (primary.width * primary.height > maxPixels) return parentPort.postMessage({ id, tooManyPixels: true });
      const { width, height, data } = await primary.decode();
      parentPort.postMessage({ id, width, height, data }, [data.buffer]);
    } finally {
      images.dispose();
    }
  } catch (error) {
    parentPort.postMessage({ id, error: String((error && error.message) || error) });
  }
});
`;

interface Reply {
  id: number;
  width?: number;
  height?: number;
  data?: Uint8ClampedArray;
  tooManyPixels?: boolean;
  error?: string;
}

const require = createRequire(import.meta.url);
const pending = new Map<number, { resolve: (image: DecodedHeic) => void; reject: (error: Error) => void }>();
let worker: Worker | undefined;
let nextId = 1;

function decoderThread(): Worker {
  if (worker) return worker;
  const thread = new Worker(WORKER_SOURCE, { eval: true, workerData: { decoderPath: require.resolve('heic-decode') } });
  thread.unref();
  thread.on('message', (reply: Reply) => {
    const waiting = pending.get(reply.id);
    if (!waiting) return;
    pending.delete(reply.id);
    if (reply.tooManyPixels) waiting.reject(new RangeError('too many pixels'));
    else if (reply.error !== undefined || !reply.data) waiting.reject(new Error(reply.error ?? 'no pixels'));
    else waiting.resolve({ width: reply.width!, height: reply.height!, data: reply.data });
  });
  // A crashed worker (e.g. out of memory) fails what it held; the next photo starts a new one.
  const fail = (error: Error) => {
    if (worker === thread) worker = undefined;
    for (const waiting of pending.values()) waiting.reject(error);
    pending.clear();
  };
  thread.on('error', fail);
  thread.on('exit', (code) => fail(new Error(`The HEIC decoder stopped (exit ${code}).`)));
  worker = thread;
  return thread;
}

/**
 * Decodes the primary image in the decoder thread, refusing it before decoding when it has more
 * than `maxPixels`. Throws RangeError for too many pixels, and the decoder's own error for damaged files.
 */
export function decodeHeic(buffer: Uint8Array, maxPixels: number): Promise<DecodedHeic> {
  const thread = decoderThread();
  const id = nextId++;
  return new Promise<DecodedHeic>((resolve, reject) => {
    pending.set(id, { resolve, reject });
    thread.ref();
    thread.postMessage({ id, buffer, maxPixels });
  }).finally(() => {
    if (pending.size === 0) thread.unref();
  });
}
