// Which files a claim takes, how big, and of which real type. The server checks the bytes
// against these after upload; the browser uses the same list to refuse early.
export const ATTACHMENT_KINDS = [
  'photo', 'serial_label_photo', 'proof_of_purchase', 'diagnostic_log', 'load_test_before', 'load_test_after',
  'core_disposal_proof', 'inspection_photo',
] as const;
export type AttachmentKind = (typeof ATTACHMENT_KINDS)[number];

export const ATTACHMENT_LABELS: Record<AttachmentKind, string> = {
  photo: 'Photo of the fault',
  serial_label_photo: 'Photo of the serial label',
  proof_of_purchase: 'Proof of purchase',
  diagnostic_log: 'Diagnostic log',
  load_test_before: 'Load test before repair',
  load_test_after: 'Load test after repair',
  core_disposal_proof: 'Proof of local recycling or scrapping',
  inspection_photo: 'Inspection photo',
};

export const PHOTO_KINDS: readonly AttachmentKind[] = ['photo', 'serial_label_photo', 'core_disposal_proof', 'inspection_photo'];
export const LOAD_TEST_KINDS: readonly AttachmentKind[] = ['load_test_before', 'load_test_after'];

export const MB = 1024 * 1024;
export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;
export const DOCUMENT_TYPES = ['application/pdf', 'image/jpeg', 'image/png', 'image/webp', 'text/plain'] as const;
export const LOAD_TEST_TYPES = ['text/csv'] as const;

type Rule = { maxBytes: number; types: readonly string[]; extensions: readonly string[]; describe: string };

export const ATTACHMENT_RULES: Record<'photo' | 'document' | 'load_test', Rule> = {
  photo: { maxBytes: 15 * MB, types: PHOTO_TYPES, extensions: ['jpg', 'jpeg', 'png', 'webp'], describe: 'JPEG, PNG or WebP photos up to 15 MB' },
  document: { maxBytes: 20 * MB, types: DOCUMENT_TYPES, extensions: ['pdf', 'jpg', 'jpeg', 'png', 'webp', 'txt', 'log'], describe: 'PDF, image or plain-text files up to 20 MB' },
  load_test: { maxBytes: 50 * MB, types: LOAD_TEST_TYPES, extensions: ['csv', 'txt'], describe: 'CSV files up to 50 MB' },
};

export function ruleFor(kind: AttachmentKind): Rule {
  if (PHOTO_KINDS.includes(kind)) return ATTACHMENT_RULES.photo;
  if (LOAD_TEST_KINDS.includes(kind)) return ATTACHMENT_RULES.load_test;
  return ATTACHMENT_RULES.document;
}

export function extensionOf(fileName: string): string {
  const m = /\.([A-Za-z0-9]+)$/.exec(fileName);
  return m ? m[1]!.toLowerCase() : '';
}

/** Checks what the browser declares before any upload is allowed; null when acceptable. */
export function declaredFileProblem(kind: AttachmentKind, fileName: string, size: number): string | null {
  const rule = ruleFor(kind);
  if (!Number.isSafeInteger(size) || size <= 0) return `${fileName} is empty.`;
  if (size > rule.maxBytes) return `${fileName} is ${(size / MB).toFixed(1)} MB; ${ATTACHMENT_LABELS[kind].toLowerCase()} takes ${rule.describe}.`;
  const ext = extensionOf(fileName);
  if (!rule.extensions.includes(ext)) return `${fileName} is not one of the accepted files: ${rule.describe}.`;
  return null;
}

type Who = 'dealer' | 'brand_rep' | 'warehouse';

/**
 * Which party may add which kind of file in which stage: the dealer while preparing or
 * answering, evidence for an appeal while denied, the after-test once approved; the rep
 * the proof of a waived core; the warehouse its inspection photos.
 */
export function canAttach(kind: AttachmentKind, who: Who, stage: string): boolean {
  if (who === 'dealer') {
    if (['draft', 'waiting_on_dealer', 'denied'].includes(stage)) {
      return !['load_test_after', 'core_disposal_proof', 'inspection_photo'].includes(kind);
    }
    if (stage === 'approved') return ['load_test_after', 'core_disposal_proof', 'photo'].includes(kind);
    return false;
  }
  if (who === 'brand_rep') return kind === 'core_disposal_proof' && stage === 'approved';
  if (who === 'warehouse') return kind === 'inspection_photo' && stage === 'approved';
  return false;
}
