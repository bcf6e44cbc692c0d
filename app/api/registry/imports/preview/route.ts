import { apiRoute } from '@/lib/http/api';
import { previewRegistryImport } from '@/lib/services/registry';
import { registryFileFrom } from '@/lib/http/registry-file';

// Reads and checks a registry file; nothing is written until the admin confirms.
export const POST = apiRoute(['brand_admin'], async ({ user, req }) => {
  const { file } = await registryFileFrom(req);
  return previewRegistryImport(user, file);
});
