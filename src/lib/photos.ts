/**
 * Photos of coupons: what may be uploaded, and the shapes the API answers with. Pure and free of
 * zod, so islands can import it cheaply; the request schemas are in photo-requests.ts.
 */
import type { Lab } from './colour';

/** Content types accepted for upload, with the file extension their stored original gets. */
export const PHOTO_TYPES = {
  'image/jpeg': 'jpg',
  'image/png': 'png',
  'image/webp': 'webp',
  'image/heic': 'heic',
  'image/heif': 'heif',
} as const;
export type PhotoContentType = keyof typeof PHOTO_TYPES;
export const photoContentTypes = Object.keys(PHOTO_TYPES) as PhotoContentType[];

export const MAX_UPLOAD_BYTES = 30 * 1024 * 1024;
export const MAX_UPLOAD_MEGABYTES = 30;
/** Why an upload is refused before anything is stored (the browser checks first, the server again). */
export const UNACCEPTED_TYPE = 'Only JPEG, PNG, WebP and HEIC/HEIF photos are accepted.';
export const TOO_BIG = `The photo is larger than ${MAX_UPLOAD_MEGABYTES} MB. Upload a smaller copy.`;

/** How long a presigned upload URL may be used. */
export const UPLOAD_EXPIRY_SECONDS = 10 * 60;

const TYPE_BY_EXTENSION: Record<string, PhotoContentType> = {
  jpg: 'image/jpeg',
  jpeg: 'image/jpeg',
  png: 'image/png',
  webp: 'image/webp',
  heic: 'image/heic',
  heif: 'image/heif',
};

/**
 * The content type to declare for a picked file: the browser's, or one read from the name when
 * the browser gave none (desktop browsers often leave HEIC blank).
 */
export function declaredContentType(file: { name: string; type: string }): string {
  if (file.type) return file.type;
  const extension = file.name.toLowerCase().split('.').pop() ?? '';
  return TYPE_BY_EXTENSION[extension] ?? 'application/octet-stream';
}

export const isPhotoContentType = (type: string): type is PhotoContentType => type in PHOTO_TYPES;

const KIND_NAMES: Record<PhotoContentType, string> = {
  'image/jpeg': 'JPEG',
  'image/png': 'PNG',
  'image/webp': 'WebP',
  'image/heic': 'HEIC',
  'image/heif': 'HEIF',
};

/** True when two content types name the same kind of image: HEIC is HEIF coded with HEVC, and phones and browsers label it either way. */
export function sameImageKind(first: PhotoContentType, second: PhotoContentType): boolean {
  const kind = (type: PhotoContentType) => (type === 'image/heif' ? 'image/heic' : type);
  return kind(first) === kind(second);
}

/** Why a file is refused whose content, as decoded, is another kind of image than the one declared. */
export function kindMismatchMessage(decoded: PhotoContentType, declared: PhotoContentType): string {
  return `This file is a ${KIND_NAMES[decoded]} image, but it was declared as ${KIND_NAMES[declared]}. Give it the right file name (.${PHOTO_TYPES[decoded]}) and upload it again.`;
}

/**
 * What POST /api/uploads answers: PUT the file's bytes to `url` with exactly `headers` before
 * `expiresAt`. The URL is signed for the declared content type and size (the client's own
 * Content-Length must equal the size declared), so storage refuses any other.
 */
export interface UploadTicket {
  key: string;
  url: string;
  headers: Record<string, string>;
  expiresAt: string;
}

export type RegionKind = 'layer' | 'grey';

/** A rectangle in pixels of the upright full-size photo. */
export interface Rectangle {
  x: number;
  y: number;
  width: number;
  height: number;
}

/**
 * A region as sent: one per layer of the coupon, and at most one on a grey card, with the card's
 * reflectance in percent when it is not a standard 18 % card.
 */
export type RegionInput = ({ kind: 'layer'; layerId: number } | { kind: 'grey'; reflectance?: number }) & Rectangle;

export interface RegionView extends Rectangle {
  id: number;
  kind: RegionKind;
  layerId: number | null;
  /** A grey card's reflectance in percent when the person gave one (null: a standard 18 % card). */
  reflectance: number | null;
}

/** A standard grey card reflects 18 % (CIELAB L* 49.5); other cards take a value from 3 to 95 %. */
export const GREY_CARD_REFLECTANCE = { standard: 18, min: 3, max: 95 } as const;

/** One extracted colour: CIELAB (D65) and OKLab, its share of the region's used pixels, and its spread. */
export interface SwatchView {
  hex: string;
  lab: Lab;
  oklab: Lab;
  share: number;
  spread: number;
}

/** The tint band of the layer's alloy whose colour is nearest the region's dominant film colour, and the film it means. */
export interface NearestTint {
  name: string;
  thicknessNm: number;
  deltaE00: number;
  /** Said beside the band when the match could not rest on the photo's exposure (no grey card). */
  note?: string;
}

/**
 * The swatches of one layer's region, or of the whole photo when no layer region is drawn
 * (then `layerId` and `regionId` are null and the background is part of what was measured).
 */
export interface SwatchGroup {
  regionId: number | null;
  layerId: number | null;
  mean: SwatchView | null;
  swatches: SwatchView[];
  tint: NearestTint | null;
}

export interface PhotoView {
  id: number;
  couponId: number;
  /** Upright full-size pixels; regions are given in these. */
  width: number;
  height: number;
  contentType: string;
  byteSize: number;
  takenAt: string | null;
  camera: string | null;
  lens: string | null;
  exposure: string | null;
  whiteBalance: string | null;
  createdAt: string;
  /** Short-lived presigned URLs. */
  displayUrl: string;
  thumbUrl: string;
  regions: RegionView[];
  /** True when a grey card region removed the light's colour cast. */
  whiteBalanced: boolean;
  groups: SwatchGroup[];
}

/** The layers a photo's regions refer to, as the coupon page knows them. */
export interface PhotoLayer {
  id: number;
  position: number;
  alloy: string;
  alloyName: string;
}

export const layerLabel = (layer: Pick<PhotoLayer, 'position' | 'alloyName'>) => `Layer ${layer.position + 1}: ${layer.alloyName}`;

/** toFixed without a "-0.0". */
function fixed(value: number, places: number): string {
  const text = value.toFixed(places);
  return /^-0\.?0*$/.test(text) ? text.slice(1) : text;
}

/** "L* 52.1  a* −3.4  b* 18.0" with a true minus sign. */
export function formatLab(lab: Lab): string {
  const part = (name: string, value: number) => `${name} ${fixed(value, 1).replace('-', '−')}`;
  return `${part('L*', lab.l)}  ${part('a*', lab.a)}  ${part('b*', lab.b)}`;
}

export const formatShare = (share: number) => `${Math.round(share * 100)} %`;

export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${Math.round(bytes / 1024)} kB`;
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
}

/** A rectangle that reaches outside a photo of the given size, as a message; null when it fits. */
export function outsideMessage(region: Rectangle, size: { width: number; height: number }): string | null {
  if (region.x + region.width <= size.width && region.y + region.height <= size.height) return null;
  return `The rectangle reaches outside the photo (${size.width} × ${size.height} pixels).`;
}
