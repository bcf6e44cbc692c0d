import { z } from 'zod';

export const unitsSchema = z.enum(['metric', 'imperial'], { message: 'Choose metric or imperial units.' });
export type Units = z.infer<typeof unitsSchema>;
