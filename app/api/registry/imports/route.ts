import { NextResponse } from 'next/server';
import { z } from 'zod';
import { apiRoute } from '@/lib/http/api';
import { confirmRegistryImport } from '@/lib/services/registry';
import { registryFileFrom } from '@/lib/http/registry-file';

const seen = z.object({
  sha256: z.string().regex(/^[0-9a-f]{64}$/, 'The preview is missing; upload the file again.'),
  readyKey: z.string().regex(/^[0-9a-f]{64}$/, 'The preview is missing; upload the file again.'),
});

// Imports the ready rows of the previewed file, in one transaction.
export const POST = apiRoute(['brand_admin'], async ({ user, req }) => {
  const { file, form } = await registryFileFrom(req);
  const result = await confirmRegistryImport(user, file, seen.parse({ sha256: form.get('sha256'), readyKey: form.get('readyKey') }));
  return NextResponse.json(result, { status: 201 });
});
