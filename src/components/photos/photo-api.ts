import { declaredContentType, type PhotoView, type RegionInput, type UploadTicket } from '~/lib/photos';
import { callApi } from '~/components/api-client';

/** The browser's side of the photo routes: JSON calls, and the PUT straight to storage with progress. */

/** A failed step, with the message to show beside the file. */
export class StepFailed extends Error {}

async function call<T>(url: string, method: 'POST' | 'PUT' | 'DELETE', body?: unknown): Promise<T> {
  const answer = await callApi<T>(url, { method, body });
  if (!answer.ok) throw new StepFailed(answer.message);
  return answer.body;
}

export const askForUpload = (file: File) =>
  call<UploadTicket>('/api/uploads', 'POST', { filename: file.name, contentType: declaredContentType(file), size: file.size });

export const attachUpload = (couponId: number, key: string) => call<PhotoView>(`/api/coupons/${couponId}/photos`, 'POST', { key });

export const saveRegions = (photoId: number, regions: RegionInput[]) => call<PhotoView>(`/api/photos/${photoId}/regions`, 'PUT', { regions });

export const removePhoto = (photoId: number) => call<void>(`/api/photos/${photoId}`, 'DELETE');

export interface Transfer {
  done: Promise<void>;
  cancel: () => void;
}

/** PUTs the file to its presigned URL with XMLHttpRequest, reporting progress from 0 to 1. */
export function sendFile(ticket: UploadTicket, file: File, onProgress: (fraction: number) => void): Transfer {
  const request = new XMLHttpRequest();
  const done = new Promise<void>((resolve, reject) => {
    request.upload.onprogress = (event) => {
      if (event.lengthComputable) onProgress(event.loaded / event.total);
    };
    request.onload = () => {
      if (request.status >= 200 && request.status < 300) {
        onProgress(1);
        resolve();
      } else reject(new StepFailed(`Storage refused the file (${request.status}). Try again.`));
    };
    request.onerror = () => reject(new StepFailed('The upload was interrupted. Check the network and try again.'));
    request.onabort = () => reject(new StepFailed('Cancelled.'));
  });
  request.open('PUT', ticket.url);
  for (const [name, value] of Object.entries(ticket.headers)) request.setRequestHeader(name, value);
  request.send(file);
  return { done, cancel: () => request.abort() };
}
