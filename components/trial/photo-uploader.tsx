'use client';

import { useRouter } from 'next/navigation';
import { useState, useTransition } from 'react';
import { PhotoInput, UploadList, usePhotoUploads } from './photo-uploads';

/**
 * Adds photos to a trial (not to a check-in): they upload as soon as they are
 * picked, each with a progress bar; the page refreshes when all are done.
 */
export function PhotoUploader({ trialId }: { trialId: number }) {
  const router = useRouter();
  const uploads = usePhotoUploads();
  const [inputKey, setInputKey] = useState(0);
  const [, startTransition] = useTransition();

  async function onFiles(files: File[]) {
    if (!files.length) return;
    const ok = await uploads.upload(files, `/api/trials/${trialId}/photos`);
    setInputKey((k) => k + 1);
    if (ok) startTransition(() => router.refresh());
  }

  return (
    <div className="max-w-3xl space-y-3 pt-2">
      <PhotoInput key={inputKey} id="trial-photos" label="Add photos to this trial" onFiles={onFiles} />
      <UploadList items={uploads.items} />
    </div>
  );
}
