import { randomBytes, randomUUID } from 'node:crypto';
import { PHOTO_TYPES, type PhotoContentType } from '~/lib/photos';

/**
 * Where a photo's files live. Each upload gets its own folder under the owner's prefix,
 * `users/<id>/photos/<uuid>/`; the original and every file derived from it go in that folder,
 * so the folder is the unit the sweep and deletion clear. Derived names carry a random tag per
 * attempt, so two attaches of one upload racing each other never overwrite each other's files.
 */

/** Every object a person uploads or we derive from it lives under their own prefix. */
export const userPrefix = (userId: string) => `users/${userId}/`;

export const isUsersKey = (userId: string, key: string) => key.startsWith(userPrefix(userId)) && !key.includes('..');

export const newUploadKey = (userId: string, contentType: PhotoContentType) =>
  `${userPrefix(userId)}photos/${randomUUID()}/original.${PHOTO_TYPES[contentType]}`;

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
