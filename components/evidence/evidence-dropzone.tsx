'use client';

import clsx from 'clsx';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useDropzone } from 'react-dropzone';
import { ATTACHMENT_LABELS, declaredFileProblem, ruleFor, type AttachmentKind } from '@/lib/claims/attachment-rules';

type Item = { key: string; name: string; progress: number; status: 'hashing' | 'uploading' | 'checking' | 'done' | 'failed'; message?: string };

export async function sha256Hex(file: File): Promise<string> {
  const digest = await crypto.subtle.digest('SHA-256', await file.arrayBuffer());
  return [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, '0')).join('');
}

export function putWithProgress(url: string, file: File, headers: Record<string, string>, onProgress: (p: number) => void): Promise<void> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('PUT', url);
    for (const [k, v] of Object.entries(headers)) xhr.setRequestHeader(k, v);
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded / e.total);
    xhr.onload = () => (xhr.status >= 200 && xhr.status < 300 ? resolve() : reject(new Error(`storage answered ${xhr.status}`)));
    xhr.onerror = () => reject(new Error('the connection to storage failed'));
    xhr.send(file);
  });
}

/**
 * One slot of evidence: files go straight to storage with a presigned PUT, then the
 * server checks them before they count. Each file shows its own progress or refusal.
 */
export function EvidenceDropzone({ claimId, kind, hint, multiple = true }: { claimId: string; kind: AttachmentKind; hint?: string; multiple?: boolean }) {
  const router = useRouter();
  const [items, setItems] = useState<Item[]>([]);
  const patch = (key: string, p: Partial<Item>) => setItems((all) => all.map((i) => (i.key === key ? { ...i, ...p } : i)));

  async function upload(file: File) {
    const key = `${file.name}-${file.size}-${Date.now()}-${Math.random()}`;
    setItems((all) => [...all, { key, name: file.name, progress: 0, status: 'hashing' }]);
    const early = declaredFileProblem(kind, file.name, file.size);
    if (early) return patch(key, { status: 'failed', message: early });
    try {
      const sha256 = await sha256Hex(file);
      const ticketRes = await fetch(`/api/claims/${claimId}/uploads`, {
        method: 'POST',
        headers: { 'content-type': 'application/json' },
        body: JSON.stringify({ kind, fileName: file.name, size: file.size, sha256, contentType: file.type }),
      });
      const ticket = await ticketRes.json();
      if (!ticketRes.ok) return patch(key, { status: 'failed', message: ticket.error });
      patch(key, { status: 'uploading' });
      await putWithProgress(ticket.url, file, ticket.headers, (p) => patch(key, { progress: p }));
      patch(key, { status: 'checking', progress: 1 });
      const doneRes = await fetch(`/api/claims/${claimId}/uploads/${ticket.intentId}`, { method: 'POST' });
      const done = await doneRes.json();
      if (!doneRes.ok) return patch(key, { status: 'failed', message: done.error });
      patch(key, { status: 'done' });
      router.refresh();
    } catch (err) {
      patch(key, { status: 'failed', message: `${file.name} could not be uploaded: ${(err as Error).message}. Try again.` });
    }
  }

  const { getRootProps, getInputProps, isDragActive } = useDropzone({
    multiple,
    onDrop: (accepted) => accepted.forEach((f) => void upload(f)),
  });

  return (
    <div>
      <div
        {...getRootProps()}
        data-testid={`dropzone-${kind}`}
        className={clsx(
          'flex cursor-pointer flex-col items-center justify-center rounded-md border-2 border-dashed px-4 py-5 text-center text-sm transition-colors',
          isDragActive ? 'border-charge-500 bg-charge-50' : 'border-paper-line bg-paper hover:border-charge-300',
        )}
      >
        <input {...getInputProps()} aria-label={ATTACHMENT_LABELS[kind]} />
        <p className="font-bold">{ATTACHMENT_LABELS[kind]}</p>
        <p className="text-ink-muted">{hint ?? `Drop here or click to choose. ${ruleFor(kind).describe}.`}</p>
      </div>
      {items.length ? (
        <ul className="mt-2 space-y-1 text-sm" aria-live="polite">
          {items.map((i) => (
            <li key={i.key} data-testid="upload-item" data-status={i.status}>
              <div className="flex items-center justify-between gap-2">
                <span className="truncate">{i.name}</span>
                <span className={clsx('shrink-0 text-xs', i.status === 'failed' ? 'text-fault-700' : i.status === 'done' ? 'text-charge-700' : 'text-ink-muted')}>
                  {i.status === 'hashing' ? 'preparing…' : i.status === 'uploading' ? `${Math.round(i.progress * 100)} %` : i.status === 'checking' ? 'checking…' : i.status === 'done' ? 'added' : 'refused'}
                </span>
              </div>
              {i.status === 'uploading' || i.status === 'checking' ? (
                <div className="mt-1 h-1 overflow-hidden rounded bg-paper-sunk">
                  <div className="h-full bg-charge-500 transition-all" style={{ width: `${Math.round(i.progress * 100)}%` }} />
                </div>
              ) : null}
              {i.message ? <p className="text-xs text-fault-700" role="alert">{i.message}</p> : null}
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
