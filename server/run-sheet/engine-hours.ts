import { formatEngineHours } from '../../shared/figures';
import { AppError } from '../http/errors';

/** An engine-hour reading lower than one already known: the meter does not run backwards. */
export const backwards = (reading: number, known: number, what: string) =>
  new AppError(
    422,
    'engine_hours_backwards',
    `The meter reading ${formatEngineHours(reading)} is less than ${what}, ${formatEngineHours(known)}; an engine-hour meter does not run backwards. Check the reading.`,
    {
      engineHours: `At least ${formatEngineHours(known)}`,
    },
  );
