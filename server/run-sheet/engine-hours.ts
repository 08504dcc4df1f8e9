import { AppError } from '../http/errors';

/** An engine-hour reading lower than one already known: the meter does not run backwards. */
export const backwards = (reading: number, known: number, what: string) =>
  new AppError(
    422,
    'engine_hours_backwards',
    `The meter reading ${reading} h is less than ${what}, ${known} h; an engine-hour meter does not run backwards. Check the reading.`,
    {
      engineHours: `At least ${known} h`,
    },
  );
