import { z } from 'zod';
import { canonicalTimeZone } from './time-zones.ts';

/** Roles a user can hold. `admin` is never self-chosen at sign-up. */
export const ROLES = ['runner', 'coach', 'admin'] as const;
export const RoleSchema = z.enum(ROLES, { error: 'Role must be runner, coach or admin.' });
export type Role = z.infer<typeof RoleSchema>;

export const SIGN_UP_ROLES = ['runner', 'coach'] as const;

export const UNITS = ['mi', 'km'] as const;
export const UnitSchema = z.enum(UNITS, { error: 'Units must be mi or km.' });
export type Unit = z.infer<typeof UnitSchema>;

/** The public face of a user, as the auth routes return it (api-contract.md). */
export const UserSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: RoleSchema,
});
export type User = z.infer<typeof UserSchema>;

/** A time zone the profile accepts: a current IANA name, or an outdated one (stored as the current name). */
export function isKnownTimeZone(name: string): boolean {
  return canonicalTimeZone(name) !== null;
}

export const NameSchema = z
  .string({ error: 'Enter your name.' })
  .trim()
  .min(1, 'Enter your name.')
  .max(80, 'Keep the name under 80 characters.');

const currentYearUpperBound = 2100;

/** How far from the target pace still counts as on pace, as a share (0.02 = ±2 %, the default). */
export const PaceToleranceSchema = z
  .number({ error: 'Tolerance must be a number, e.g. 0.02 for ±2 %.' })
  .min(0.005, 'Use a tolerance of at least ±0.5 %.')
  .max(0.1, 'Use a tolerance of at most ±10 %.');

/** Everything a user can set about themselves on the profile page. Heart rates in beats per minute, weight in kg. */
export const ProfileSchema = UserSchema.extend({
  unit: UnitSchema,
  birth_year: z.number().int().nullable(),
  resting_hr: z.number().int().nullable(),
  max_hr: z.number().int().nullable(),
  weight_kg: z.number().nullable(),
  time_zone: z.string(),
  pace_tolerance: z.number(),
  notify_on_import: z.boolean(),
  notify_on_plan_change: z.boolean(),
  week_starts_on: z.number().int(),
  sex: z.enum(['male', 'female']).nullable(),
  created_at: z.string(),
});
export type Profile = z.infer<typeof ProfileSchema>;
/** `GET /api/me` and `PATCH /api/me`: the signed-in user's profile. */
export const ProfileAnswerSchema = z.object({ profile: ProfileSchema });
export type ProfileAnswer = z.infer<typeof ProfileAnswerSchema>;

export const UpdateProfileInputSchema = z
  .object({
    name: NameSchema,
    unit: UnitSchema,
    birth_year: z
      .number({ error: 'Birth year must be a whole number.' })
      .int('Birth year must be a whole number.')
      .min(1900, 'Birth year must be 1900 or later.')
      .max(currentYearUpperBound, 'Birth year looks wrong.')
      .nullable(),
    resting_hr: z
      .number({ error: 'Resting heart rate must be a number.' })
      .int('Resting heart rate must be a whole number of beats per minute.')
      .min(25, 'Resting heart rate must be between 25 and 120 bpm.')
      .max(120, 'Resting heart rate must be between 25 and 120 bpm.')
      .nullable(),
    max_hr: z
      .number({ error: 'Maximum heart rate must be a number.' })
      .int('Maximum heart rate must be a whole number of beats per minute.')
      .min(100, 'Maximum heart rate must be between 100 and 240 bpm.')
      .max(240, 'Maximum heart rate must be between 100 and 240 bpm.')
      .nullable(),
    weight_kg: z
      .number({ error: 'Weight must be a number.' })
      .min(25, 'Weight must be between 25 and 250 kg.')
      .max(250, 'Weight must be between 25 and 250 kg.')
      .nullable(),
    pace_tolerance: PaceToleranceSchema,
    notify_on_import: z.boolean({ error: 'Choose yes or no.' }),
    notify_on_plan_change: z.boolean({ error: 'Choose yes or no.' }),
    week_starts_on: z
      .number({ error: 'Choose the day your week starts on.' })
      .int()
      .min(0, 'Choose a day from Sunday (0) to Saturday (6).')
      .max(6, 'Choose a day from Sunday (0) to Saturday (6).'),
    sex: z.enum(['male', 'female'], { error: 'Choose male, female, or leave it empty.' }).nullable(),
    time_zone: z
      .string({ error: 'Choose a time zone.' })
      .refine(isKnownTimeZone, 'Choose a time zone from the list, e.g. Europe/Berlin.')
      // An older client's Asia/Calcutta is stored and answered as Asia/Kolkata (issue 17).
      .transform((name) => canonicalTimeZone(name) ?? name),
  })
  .partial()
  .refine((p) => p.resting_hr == null || p.max_hr == null || p.resting_hr < p.max_hr, {
    message: 'Resting heart rate must be below maximum heart rate.',
    path: ['resting_hr'],
  })
  .strict();
export type UpdateProfileInput = z.infer<typeof UpdateProfileInputSchema>;

export const ChangeRoleInputSchema = z.object({ role: RoleSchema }).strict();
export type ChangeRoleInput = z.infer<typeof ChangeRoleInputSchema>;

export const AdminUserSchema = UserSchema.extend({ created_at: z.string() });
export type AdminUser = z.infer<typeof AdminUserSchema>;
/** `GET /api/admin/users`: every account, for the admin. */
export const AdminUserListAnswerSchema = z.object({ users: z.array(AdminUserSchema) });
export type AdminUserListAnswer = z.infer<typeof AdminUserListAnswerSchema>;
