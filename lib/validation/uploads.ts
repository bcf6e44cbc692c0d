import { z } from 'zod';
import { ATTACHMENT_KINDS } from '@/lib/claims/attachment-rules';

export const uploadRequestSchema = z.object({
  kind: z.enum(ATTACHMENT_KINDS, { message: 'Say what the file shows.' }),
  fileName: z.string().trim().min(1).max(200),
  size: z.number().int().min(1, 'The file is empty.'),
  sha256: z.string().regex(/^[0-9a-fA-F]{64}$/, 'The file checksum is missing.'),
  contentType: z.string().max(100).default(''),
});
