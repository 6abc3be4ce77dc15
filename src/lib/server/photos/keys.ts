import { randomBytes, randomUUID } from 'node:crypto';
import { PHOTO_TYPES, type PhotoContentType } from '../../photos';
import { presignGet } from '../storage';

/**
 * Where a photo's files live. Each upload gets its own folder under the owner's prefix,
 * `users/<id>/photos/<uuid>/`; the original and every file derived from it go in that folder,
 * so the folder is the unit the sweep and deletion clear. Derived names carry a random tag per
 * attempt, so two attaches of one upload racing each other never overwrite each other's files.
 */

/** Every object a person uploads or we derive from it lives under their own prefix. */
export const userPrefix = (userId: string) => `users/${userId}/`;

export const isUsersKey = (userId: string, key: string) => key.startsWith(userPrefix(userId)) && !key.includes('..');

export const newUploadKey = (userId: string, contentType: PhotoContentType) => `${userPrefix(userId)}photos/${randomUUID()}/original.${PHOTO_TYPES[contentType]}`;

/** The folder of a key: everything up to and including its last slash. */
export const folderOf = (key: string) => key.slice(0, key.lastIndexOf('/') + 1);

export interface DerivedKeys {
  display: string;
  thumb: string;
  analysis: string;
  /** Where a copy of the original without its GPS position goes, when one is needed. */
  positionFree: (contentType: PhotoContentType) => string;
}

export function derivedKeys(originalKey: string): DerivedKeys {
  const stem = `${folderOf(originalKey)}${randomBytes(4).toString('hex')}-`;
  return {
    display: `${stem}display.webp`,
    thumb: `${stem}thumb.webp`,
    analysis: `${stem}analysis.png`,
    positionFree: (contentType) => `${stem}original.${PHOTO_TYPES[contentType]}`,
  };
}

/** How long a URL to show a photo stays valid, at least. */
const VIEW_WINDOW_SECONDS = 15 * 60;

/**
 * A presigned GET for showing a derived file to someone who may see it. Signed at the start of
 * the current 15-minute window and valid for two windows, so the URL stays the same for a while
 * (browsers cache the image) and is good for at least 15 minutes after it is handed out.
 */
export function viewUrl(key: string, now = Date.now()): Promise<string> {
  const windowStart = new Date(Math.floor(now / (VIEW_WINDOW_SECONDS * 1000)) * VIEW_WINDOW_SECONDS * 1000);
  return presignGet(key, 2 * VIEW_WINDOW_SECONDS, windowStart);
}
