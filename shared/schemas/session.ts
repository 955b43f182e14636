import { z } from 'zod';
import type { Role } from '../enums';

export const signInSchema = z.object({
  email: z.string({ error: 'is required' }).trim().toLowerCase().email('must be an e-mail address').max(254),
  password: z.string({ error: 'is required' }).min(1, 'is required').max(1024, 'is too long'),
});
export type SignInInput = z.infer<typeof signInSchema>;

export interface SessionUser {
  id: number;
  email: string;
  name: string;
  role: Role;
}

export interface SessionBody {
  user: SessionUser | null;
  csrfToken: string;
}
