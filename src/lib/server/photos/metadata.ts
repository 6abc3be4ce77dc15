import exifr from 'exifr';
import sharp from 'sharp';

/**
 * What a photo's metadata says: the EXIF a photo row keeps (when, which camera, how exposed),
 * and whether the file records where it was taken (GPS). The position itself is never kept.
 */

/** What is kept of a photo's EXIF. GPS position is never read. */
export interface PhotoExif {
  /** Local time as written by the camera, ISO 8601, with its offset when the camera recorded one. */
  takenAt: string | null;
  cameraMake: string | null;
  cameraModel: string | null;
  lens: string | null;
  /** e.g. "1/125 s f/5.6 ISO 200". */
  exposure: string | null;
  whiteBalance: 'auto' | 'manual' | null;
}

const EXIF_OPTIONS = {
  ifd0: { pick: ['Make', 'Model'] },
  exif: { pick: ['DateTimeOriginal', 'OffsetTimeOriginal', 'ExposureTime', 'FNumber', 'ISO', 'LensModel', 'WhiteBalance'] },
  gps: false,
  ifd1: false,
  interop: false,
  xmp: false,
  icc: false,
  iptc: false,
  jfif: false,
  ihdr: false,
  makerNote: false,
  userComment: false,
  reviveValues: false,
  translateValues: false,
};

const text = (value: unknown) => (typeof value === 'string' && value.trim() ? value.trim() : null);
const firstNumber = (value: unknown) => {
  const number = Array.isArray(value) ? value[0] : value;
  return typeof number === 'number' && Number.isFinite(number) && number > 0 ? number : null;
};

/** EXIF "YYYY:MM:DD HH:MM:SS" (+ optional "±HH:MM" offset) → ISO 8601, per CIPA DC-008 (Exif 2.32) §4.6.5. */
export function formatTakenAt(dateTime: unknown, offset: unknown): string | null {
  const match = typeof dateTime === 'string' && /^(\d{4}):(\d{2}):(\d{2}) (\d{2}):(\d{2}):(\d{2})/.exec(dateTime);
  if (!match || match[1] === '0000') return null;
  const zone = typeof offset === 'string' && /^[+-]\d{2}:\d{2}$/.test(offset) ? offset : '';
  return `${match[1]}-${match[2]}-${match[3]}T${match[4]}:${match[5]}:${match[6]}${zone}`;
}

/** "1/125 s f/5.6 ISO 200"; parts the camera did not record are left out. */
export function formatExposure(exposureTime: unknown, fNumber: unknown, iso: unknown): string | null {
  const parts: string[] = [];
  const seconds = firstNumber(exposureTime);
  if (seconds) parts.push(seconds >= 1 ? `${Number(seconds.toFixed(1))} s` : `1/${Math.round(1 / seconds)} s`);
  const aperture = firstNumber(fNumber);
  if (aperture) parts.push(`f/${Number(aperture.toFixed(1))}`);
  const speed = firstNumber(iso);
  if (speed) parts.push(`ISO ${Math.round(speed)}`);
  return parts.length ? parts.join(' ') : null;
}

export async function readExif(buffer: Uint8Array): Promise<PhotoExif> {
  const tags: Record<string, unknown> = (await exifr.parse(buffer, EXIF_OPTIONS).catch(() => undefined)) ?? {};
  const make = text(tags.Make);
  let model = text(tags.Model);
  if (make && model?.toLowerCase().startsWith(`${make.toLowerCase()} `)) model = model.slice(make.length + 1);
  return {
    takenAt: formatTakenAt(tags.DateTimeOriginal, tags.OffsetTimeOriginal),
    cameraMake: make,
    cameraModel: model,
    lens: text(tags.LensModel),
    exposure: formatExposure(tags.ExposureTime, tags.FNumber, tags.ISO),
    whiteBalance: tags.WhiteBalance === 0 ? 'auto' : tags.WhiteBalance === 1 ? 'manual' : null,
  };
}

/** EXIF "taken at": with its offset it is an instant; without one it is the camera's wall clock, kept as if UTC. */
export function takenAtDate(takenAt: string | null): Date | null {
  if (!takenAt) return null;
  const date = new Date(/[+-]\d{2}:\d{2}$/.test(takenAt) ? takenAt : `${takenAt}Z`);
  return Number.isNaN(date.getTime()) ? null : date;
}

/** The EXIF as a photo row keeps it. */
export function exifColumns(exif: PhotoExif) {
  const camera = [exif.cameraMake, exif.cameraModel].filter(Boolean).join(' ') || null;
  return { takenAt: takenAtDate(exif.takenAt), camera, lens: exif.lens, exposure: exif.exposure, whiteBalance: exif.whiteBalance };
}

/** The EXIF block sharp found, as TIFF (sharp gives JPEG and WebP blocks with their "Exif\0\0" header). */
function tiffOf(exif: Buffer): Buffer {
  for (let offset = 0; offset + 4 <= Math.min(exif.length, 16); offset += 1) {
    const mark = exif.toString('latin1', offset, offset + 4);
    if (mark === 'II*\0' || mark === 'MM\0*') return exif.subarray(offset);
  }
  return exif;
}

/**
 * True when the file records where it was taken: a GPS position in its EXIF or XMP. Read through
 * sharp's metadata, which finds the EXIF of JPEG, PNG, WebP and HEIC alike.
 */
export async function carriesPosition(buffer: Uint8Array): Promise<boolean> {
  const metadata = await sharp(buffer)
    .metadata()
    .catch(() => undefined);
  if (!metadata) return false;
  if (metadata.xmp && /GPS(Latitude|Longitude)/.test(metadata.xmp.toString('latin1'))) return true;
  if (!metadata.exif) return false;
  try {
    const position = await exifr.gps(tiffOf(metadata.exif));
    return Boolean(position && (Number.isFinite(position.latitude) || Number.isFinite(position.longitude)));
  } catch {
    return true; // an EXIF block that cannot be read might still hold a position: play safe
  }
}
