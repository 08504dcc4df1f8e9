import * as z from 'zod';
import { UNIT_SYSTEMS, type UnitSystem } from './auth';

/** True for a time zone name the platform's own time zone data knows (IANA names: America/Chicago). */
export function isTimeZone(name: string): boolean {
  if (!/^[A-Za-z][A-Za-z0-9_+\-/]*$/.test(name)) return false;
  try {
    new Intl.DateTimeFormat('en-US', { timeZone: name });
    return true;
  } catch {
    return false;
  }
}

export const timeZone = z
  .string()
  .trim()
  .max(64)
  .refine(isTimeZone, 'That is not a time zone we know; pick one from the list (for example America/Chicago)');

/** The owner's changes to the farm's own settings; at least one. */
export const farmPatchBody = z
  .object({
    name: z.string().trim().min(1, 'The farm needs a name').max(160).optional(),
    units: z.enum(UNIT_SYSTEMS).optional(),
    dayHoursLimit: z.number().min(1, 'A working day is at least 1 hour').max(24, 'A day has 24 hours').optional(),
    timeZone: timeZone.optional(),
  })
  .refine((v) => Object.keys(v).length > 0, 'Nothing to change');
export type FarmPatch = z.infer<typeof farmPatchBody>;

/** What `GET /api/farm` and `PATCH /api/farm` answer. */
export interface FarmSettings {
  id: number;
  name: string;
  units: UnitSystem;
  /** Hours one person may be planned for in a day before the board warns. */
  dayHoursLimit: number;
  /** IANA time zone of the farm: its today and tomorrow. */
  timeZone: string;
}
