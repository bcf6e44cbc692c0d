import { ATTACHMENT_LABELS, PHOTO_KINDS } from '@/lib/claims/attachment-rules';
import type { Attachment } from '@/lib/db/attachments';
import { RemoveAttachmentButton } from '@/components/evidence/remove-attachment-button';

const kb = (n: number) => (n > 1024 * 1024 ? `${(n / 1024 / 1024).toFixed(1)} MB` : `${Math.max(1, Math.round(n / 1024))} kB`);

/** Photos as thumbnails, documents as a list; every link is a short-lived one checked per request. */
export function EvidenceGallery({ claimId, attachments, removable }: { claimId: string; attachments: Attachment[]; removable: boolean }) {
  const photos = attachments.filter((a) => PHOTO_KINDS.includes(a.kind));
  const docs = attachments.filter((a) => !PHOTO_KINDS.includes(a.kind));
  if (!attachments.length) return <p className="text-sm text-ink-muted">No evidence yet.</p>;
  return (
    <div className="space-y-4">
      {photos.length ? (
        <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4">
          {photos.map((p) => (
            <li key={p.id} className="overflow-hidden rounded-md border border-paper-line bg-paper-raised" data-testid="evidence-photo">
              <a href={`/api/attachments/${p.id}`} target="_blank" rel="noreferrer">
                {/* eslint-disable-next-line @next/next/no-img-element -- presigned redirect, not an optimisable asset */}
                <img src={`/api/attachments/${p.id}?thumb`} alt={`${ATTACHMENT_LABELS[p.kind]}: ${p.fileName}`} className="aspect-[4/3] w-full bg-paper-sunk object-cover" loading="lazy" />
              </a>
              <div className="flex items-start justify-between gap-2 p-2 text-xs">
                <div className="min-w-0">
                  <p className="font-bold">{ATTACHMENT_LABELS[p.kind]}</p>
                  <p className="truncate text-ink-muted">{p.fileName}</p>
                </div>
                {removable ? <RemoveAttachmentButton claimId={claimId} attachmentId={p.id} name={p.fileName} /> : null}
              </div>
            </li>
          ))}
        </ul>
      ) : null}
      {docs.length ? (
        <ul className="divide-y divide-paper-line rounded-md border border-paper-line bg-paper-raised">
          {docs.map((d) => (
            <li key={d.id} className="flex items-center justify-between gap-3 px-3 py-2 text-sm" data-testid="evidence-document">
              <div className="min-w-0">
                <p className="font-bold">{ATTACHMENT_LABELS[d.kind]}</p>
                <a className="truncate text-charge-700 underline" href={`/api/attachments/${d.id}`}>
                  {d.fileName}
                </a>
                <span className="ml-2 text-xs text-ink-muted">
                  {kb(d.sizeBytes)} · SHA-256 <span className="font-mono">{d.sha256.slice(0, 12)}…</span>
                </span>
              </div>
              {removable ? <RemoveAttachmentButton claimId={claimId} attachmentId={d.id} name={d.fileName} /> : null}
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
