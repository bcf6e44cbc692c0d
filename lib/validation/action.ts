import 'server-only';
import { unstable_rethrow } from 'next/navigation';
import { z } from 'zod';
import { AppError, ValidationError } from '@/lib/errors';
import { fieldErrorsOf } from '@/lib/validation/field-errors';

export type ActionState = { ok?: boolean; message?: string; fieldErrors?: Record<string, string[]> } | undefined;

/**
 * Wraps a server action for `useActionState`: FormData is parsed with the shared zod schema,
 * and refusals come back as a message plus per-field errors instead of a crash.
 */
export function validatedAction<S extends z.ZodType>(
  schema: S,
  fn: (data: z.infer<S>, formData: FormData) => Promise<ActionState | void>,
) {
  return async (_prev: ActionState, formData: FormData): Promise<ActionState> => {
    const parsed = schema.safeParse(Object.fromEntries(formData));
    if (!parsed.success) return { ok: false, message: 'Some fields need attention.', fieldErrors: fieldErrorsOf(parsed.error) };
    try {
      return (await fn(parsed.data, formData)) ?? { ok: true };
    } catch (err) {
      unstable_rethrow(err); // redirect() and notFound() must reach Next.js
      if (err instanceof ValidationError) return { ok: false, message: err.message, fieldErrors: err.fieldErrors };
      if (err instanceof AppError) return { ok: false, message: err.message };
      console.error(err);
      return { ok: false, message: 'Something went wrong on our side. Nothing was saved; try again.' };
    }
  };
}
