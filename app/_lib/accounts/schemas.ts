/** zod schemas of the account and lab boundaries, each defined once and shared by routes and forms. */
import { z } from 'zod';
import { ROLES } from '@/entities/membership';
import { UNIT_SYSTEMS } from '@/analysis/units/unit-system';

export const email = z
  .string()
  .trim()
  .toLowerCase()
  .max(254, 'An e-mail address has at most 254 characters.')
  .email('Enter an e-mail address like name@example.com.');
export const password = z.string().max(256, 'Use at most 256 characters.');

export const signUpInput = z.object({
  email,
  name: z.string().trim().min(1, 'Tell us your name.').max(120),
  password,
  labName: z.string().trim().max(120).optional(),
  /** where to go once the account is made (kept only when it is a path of our own origin) */
  next: z.string().max(500).optional(),
});
export const signUpConfirmInput = z.object({ token: z.string().min(10).max(200) });
export const signInInput = z.object({ email, password: password.min(1, 'Enter your password.') });
export const forgotInput = z.object({ email });
export const resetInput = z.object({ token: z.string().min(10).max(200), password });
export const changePasswordInput = z.object({
  currentPassword: z.string().min(1).max(256),
  newPassword: password,
  /** also revoke every API token (a form checkbox sends "on") */
  revokeTokens: z.union([z.boolean(), z.literal('on')]).optional().transform((v) => v === true || v === 'on'),
});
export const createLabInput = z.object({ name: z.string().trim().min(2, 'Give the lab a name.').max(120) });
export const switchLabInput = z.object({ labId: z.string().uuid() });
export const inviteInput = z.object({ email, role: z.enum(ROLES) });
export const roleInput = z.object({ role: z.enum(ROLES) });
export const tokenInput = z.object({
  name: z.string().trim().min(1, 'Name the token.').max(80),
  labId: z.string().uuid(),
  /** the current password, asked again to create a token */
  password: z.string().min(1, 'Enter your current password.').max(256),
  /** lifetime in days (default 90, at most a year); a form sends it as text */
  expiresInDays: z.coerce.number().int('Whole days.').min(1, 'At least one day.').max(365, 'At most 365 days.').default(90),
});
export const preferencesInput = z.object({ unitSystem: z.enum(UNIT_SYSTEMS) });
