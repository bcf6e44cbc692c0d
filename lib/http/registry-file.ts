import 'server-only';
import { AppError, ValidationError } from '@/lib/errors';
import { REGISTRY_LIMITS } from '@/lib/registry';
import type { RegistryFile } from '@/lib/services/registry';

/** The `file` field of a multipart request, refused clearly when it is missing or too large. */
export async function registryFileFrom(req: Request): Promise<{ file: RegistryFile; form: FormData }> {
  const length = Number(req.headers.get('content-length') ?? 0);
  if (length > REGISTRY_LIMITS.maxBytes + 64 * 1024) {
    throw new ValidationError(`The file is larger than ${REGISTRY_LIMITS.maxBytes / 1024 / 1024} MB; split it into smaller files.`, { file: ['Too large.'] });
  }
  let form: FormData;
  try {
    form = await req.formData();
  } catch {
    throw new AppError('Send the file as a form upload (multipart/form-data).', 400);
  }
  const file = form.get('file');
  if (!file || typeof file === 'string') throw new ValidationError('Choose a CSV file to upload.', { file: ['Choose a file.'] });
  return { file: { name: file.name || 'registry.csv', bytes: Buffer.from(await file.arrayBuffer()) }, form };
}
