'use client';

import { useCallback, useState } from 'react';
import { PHOTO_MAX_BYTES } from '@/lib/photos/limits';

type UploadState = 'waiting' | 'uploading' | 'done' | 'failed';

/** One file on its way up. */
export type UploadItem = { key: string; name: string; size: number; progress: number; state: UploadState; message?: string };

/**
 * Sends one file as the request body with XMLHttpRequest (fetch has no upload
 * progress), reporting progress 0..1. Resolves with the status and JSON body;
 * status 0 means the network failed.
 */
export function sendFile(url: string, file: File, onProgress: (share: number) => void): Promise<{ status: number; body: unknown }> {
  return new Promise((resolve) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', url);
    xhr.responseType = 'text';
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => {
      let body: unknown = null;
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        // not JSON: keep null
      }
      resolve({ status: xhr.status, body });
    };
    xhr.onerror = () => resolve({ status: 0, body: null });
    xhr.send(file);
  });
}

function errorText(status: number, body: unknown): string {
  const err = (body as { error?: { message?: string; fieldErrors?: Record<string, string[]> } } | null)?.error;
  if (err?.fieldErrors?.photo?.[0]) return err.fieldErrors.photo[0];
  if (err?.message) return err.message;
  if (status === 0) return 'The connection failed; try again.';
  return `The upload failed (${status}).`;
}

/**
 * Uploads files one after another to `url(file)`, tracking each one's
 * progress. Files over 10 MB are refused here before sending (the server
 * refuses them too). Returns how many succeeded.
 */
export function usePhotoUploads() {
  const [items, setItems] = useState<UploadItem[]>([]);
  const patch = (key: string, p: Partial<UploadItem>) => setItems((list) => list.map((i) => (i.key === key ? { ...i, ...p } : i)));

  const upload = useCallback(async (files: readonly File[], url: string): Promise<number> => {
    const batch = files.map((f, i) => ({ file: f, item: { key: `${Date.now()}-${i}-${f.name}`, name: f.name || 'photo', size: f.size, progress: 0, state: 'waiting' as UploadState } }));
    setItems((list) => [...list, ...batch.map((b) => b.item)]);
    let ok = 0;
    for (const { file, item } of batch) {
      if (file.size > PHOTO_MAX_BYTES) {
        patch(item.key, { state: 'failed', message: 'Photos can be at most 10 MB.' });
        continue;
      }
      patch(item.key, { state: 'uploading' });
      const res = await sendFile(url, file, (share) => patch(item.key, { progress: share }));
      if (res.status === 201) {
        ok += 1;
        patch(item.key, { state: 'done', progress: 1 });
      } else {
        patch(item.key, { state: 'failed', message: errorText(res.status, res.body) });
      }
    }
    return ok;
  }, []);

  const clearDone = useCallback(() => setItems((list) => list.filter((i) => i.state !== 'done')), []);
  return { items, upload, clearDone };
}

function sizeText(bytes: number): string {
  return bytes >= 1024 * 1024 ? `${(bytes / (1024 * 1024)).toFixed(1)} MB` : `${Math.max(1, Math.round(bytes / 1024))} kB`;
}

/** The files being uploaded, each with a progress bar and its outcome (announced politely). */
export function UploadList({ items }: { items: readonly UploadItem[] }) {
  if (!items.length) return null;
  return (
    <ul className="m-0 list-none space-y-2 p-0" aria-live="polite">
      {items.map((i) => (
        <li key={i.key} className="rounded-md border border-line bg-surface p-2">
          <div className="flex flex-wrap items-baseline justify-between gap-2 text-sm">
            <span className="min-w-0 truncate font-semibold">{i.name}</span>
            <span className="text-ink-muted">{sizeText(i.size)}</span>
          </div>
          <progress
            className="mt-1 h-3 w-full accent-accent"
            max={1}
            value={i.progress}
            aria-label={`Upload of ${i.name}`}
          />
          <p className={i.state === 'failed' ? 'text-sm font-semibold text-danger' : 'text-sm text-ink-muted'}>
            {i.state === 'waiting' && 'Waiting…'}
            {i.state === 'uploading' && `Uploading… ${Math.round(i.progress * 100)}%`}
            {i.state === 'done' && 'Uploaded.'}
            {i.state === 'failed' && (i.message ?? 'The upload failed.')}
          </p>
        </li>
      ))}
    </ul>
  );
}

/** The photo input: the phone's camera is the source (`capture="environment"`). */
export function PhotoInput({ id, name, onFiles, label = 'Photos', hint }: { id: string; name?: string; onFiles: (files: File[]) => void; label?: string; hint?: string }) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="font-semibold">
        {label}
      </label>
      <p id={`${id}-hint`} className="text-sm text-ink-muted">
        {hint ?? 'JPEG, PNG or WebP, up to 10 MB each. Location and camera details are removed before a photo is stored.'}
      </p>
      <input
        id={id}
        name={name}
        type="file"
        accept="image/jpeg,image/png,image/webp,image/*"
        capture="environment"
        multiple
        aria-describedby={`${id}-hint`}
        onChange={(e) => onFiles(Array.from(e.target.files ?? []))}
        className="min-h-touch w-full rounded-md border border-line-strong bg-surface-raised p-2 text-base file:mr-3 file:min-h-10 file:rounded-md file:border-0 file:bg-accent file:px-4 file:font-semibold file:text-accent-ink"
      />
    </div>
  );
}
