import { useEffect, useRef, useState, type DragEvent } from 'react';
import {
  declaredContentType,
  formatBytes,
  isPhotoContentType,
  MAX_UPLOAD_BYTES,
  MAX_UPLOAD_MEGABYTES,
  TOO_BIG,
  UNACCEPTED_TYPE,
  type PhotoView,
} from '~/lib/photos';
import { askForUpload, attachUpload, sendFile, StepFailed } from './photo-api';

type Status = 'queued' | 'sending' | 'measuring' | 'done' | 'failed' | 'cancelled';

interface Item {
  id: number;
  file: File;
  status: Status;
  progress: number;
  message?: string;
}

/** Files sent to storage at once; the rest wait their turn. */
const AT_ONCE = 2;

const STATUS_TEXT: Record<Status, string> = {
  queued: 'Waiting',
  sending: 'Uploading',
  measuring: 'Measuring colours',
  done: 'Added',
  failed: 'Not added',
  cancelled: 'Cancelled',
};

function refusal(file: File): string | undefined {
  if (!isPhotoContentType(declaredContentType(file))) return UNACCEPTED_TYPE;
  if (file.size > MAX_UPLOAD_BYTES) return TOO_BIG;
  if (file.size === 0) return 'The file is empty.';
  return undefined;
}

let nextId = 1;

/** The file's progress: how much has gone to storage, then a pulsing full bar while it is measured. */
function Bar({ item }: { item: Item }) {
  const measuring = item.status === 'measuring';
  const percent = Math.round(item.progress * 100);
  return (
    <div
      className="mt-2 h-2 w-full overflow-hidden rounded-full bg-ash-200"
      role="progressbar"
      aria-label={`Upload of ${item.file.name}`}
      aria-valuemin={0}
      aria-valuemax={100}
      aria-valuenow={measuring ? undefined : percent}
      aria-valuetext={measuring ? 'Uploaded; measuring colours' : `${percent} %`}
    >
      <div
        className={`h-full rounded-full bg-oxide-700 transition-[width] duration-200 ${measuring ? 'animate-pulse' : ''}`}
        style={{ width: `${measuring ? 100 : percent}%` }}
      />
    </div>
  );
}

/**
 * Photos into storage: drop them or pick them (a phone offers its camera through the same
 * picker); each goes straight to storage with its own progress bar, cancel and retry, and is
 * then attached to the coupon and measured.
 */
export default function PhotoUploader({ couponId, onAdded }: { couponId: number; onAdded: (photo: PhotoView) => void }) {
  const [items, setItems] = useState<Item[]>([]);
  const [dragging, setDragging] = useState(false);
  const cancels = useRef(new Map<number, () => void>());
  const started = useRef(new Set<number>());
  const cancelled = useRef(new Set<number>());

  const patch = (id: number, changes: Partial<Item>) => setItems((current) => current.map((item) => (item.id === id ? { ...item, ...changes } : item)));

  async function run(item: Item) {
    try {
      const ticket = await askForUpload(item.file);
      if (cancelled.current.has(item.id)) return;
      const transfer = sendFile(ticket, item.file, (progress) => patch(item.id, { progress }));
      cancels.current.set(item.id, transfer.cancel);
      await transfer.done;
      cancels.current.delete(item.id);
      if (cancelled.current.has(item.id)) return;
      patch(item.id, { status: 'measuring', progress: 1 });
      const photo = await attachUpload(couponId, ticket.key);
      patch(item.id, { status: 'done' });
      onAdded(photo);
    } catch (error) {
      cancels.current.delete(item.id);
      const message = error instanceof StepFailed ? error.message : 'Something went wrong. Try again.';
      setItems((current) => current.map((entry) => (entry.id !== item.id || entry.status === 'cancelled' ? entry : { ...entry, status: 'failed', message })));
    } finally {
      started.current.delete(item.id);
    }
  }

  useEffect(() => {
    const active = items.filter((item) => item.status === 'sending' || item.status === 'measuring').length;
    const waiting = items.filter((item) => item.status === 'queued' && !started.current.has(item.id)).slice(0, Math.max(0, AT_ONCE - active));
    for (const item of waiting) {
      started.current.add(item.id);
      patch(item.id, { status: 'sending', progress: 0, message: undefined });
      void run(item);
    }
    // The queue advances when the list changes; `run` is made anew each render and must not restart it.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [items]);

  function add(files: FileList | File[]) {
    const added = [...files].map((file): Item => {
      const message = refusal(file);
      return { id: nextId++, file, status: message ? 'failed' : 'queued', progress: 0, message };
    });
    setItems((current) => [...current, ...added]);
  }

  const cancel = (item: Item) => {
    cancelled.current.add(item.id);
    patch(item.id, { status: 'cancelled', message: undefined });
    cancels.current.get(item.id)?.();
  };
  const retry = (item: Item) => {
    cancelled.current.delete(item.id);
    patch(item.id, { status: refusal(item.file) ? 'failed' : 'queued', progress: 0 });
  };
  const dismiss = (item: Item) => setItems((current) => current.filter((entry) => entry.id !== item.id));

  const onDrop = (event: DragEvent) => {
    event.preventDefault();
    setDragging(false);
    if (event.dataTransfer.files.length) add(event.dataTransfer.files);
  };

  return (
    <div className="space-y-3">
      <div
        className={`rounded-lg border-2 border-dashed px-4 py-3 text-center transition-colors ${dragging ? 'border-temper-600 bg-ash-100' : 'border-ash-300 bg-ash-50'}`}
        onDragOver={(event) => {
          event.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={onDrop}
      >
        <p className="mb-2 text-ash-700">Drop photos of the coupon here, photographed beside a grey card if you have one.</p>
        <label className="btn btn-primary cursor-pointer">
          Choose photos
          <input
            className="sr-only"
            type="file"
            accept="image/*,.heic,.heif"
            multiple
            onChange={(event) => {
              if (event.currentTarget.files) add(event.currentTarget.files);
              event.currentTarget.value = '';
            }}
          />
        </label>
        <p className="field-hint mt-2">JPEG, PNG, WebP or HEIC, up to {MAX_UPLOAD_MEGABYTES} MB each. On a phone you can take the photo now.</p>
      </div>
      {items.length > 0 && (
        <ul className="space-y-2" aria-label="Uploads">
          {items.map((item) => (
            <li key={item.id} className="rounded-lg border border-ash-200 bg-white p-3" aria-label={item.file.name}>
              <div className="flex flex-wrap items-center justify-between gap-2">
                <span className="min-w-0 truncate font-medium">{item.file.name}</span>
                <span className="text-sm text-ash-600 tabular">
                  {formatBytes(item.file.size)} · <span role="status">{STATUS_TEXT[item.status]}</span>
                </span>
              </div>
              {item.status !== 'failed' && item.status !== 'cancelled' && <Bar item={item} />}
              {item.message && <p className="field-error mt-1">{item.message}</p>}
              <div className="mt-2 flex gap-2">
                {(item.status === 'sending' || item.status === 'queued') && (
                  <button type="button" className="btn min-h-9 px-3 py-1 text-sm" onClick={() => cancel(item)}>
                    Cancel
                  </button>
                )}
                {(item.status === 'failed' || item.status === 'cancelled') && !refusal(item.file) && (
                  <button type="button" className="btn min-h-9 px-3 py-1 text-sm" onClick={() => retry(item)}>
                    Retry
                  </button>
                )}
                {(item.status === 'failed' || item.status === 'cancelled' || item.status === 'done') && (
                  <button type="button" className="btn min-h-9 px-3 py-1 text-sm" onClick={() => dismiss(item)}>
                    Dismiss
                  </button>
                )}
              </div>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
