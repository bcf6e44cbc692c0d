import { apiRoute } from '@/lib/http/api';
import { findByRma } from '@/lib/services/warehouse';

export const GET = apiRoute<{ number: string }>(['warehouse'], async ({ user, params }) => findByRma(user, params.number));
