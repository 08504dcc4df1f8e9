import type { OperationSeason } from '@shared/schemas/season';

/** An operation with nothing planned, logged or costed: the season specs' fixtures start from it. */
export const ZERO_OPERATION: Omit<OperationSeason, 'operation'> = {
  acresPlanned: 0,
  acresCovered: 0,
  acresFinished: 0,
  hoursLogged: 0,
  engineHours: 0,
  plannedHours: null,
  acresWithPlan: 0,
  acresPerHour: null,
  plannedAcresPerHour: null,
  progress: 0,
  jobsFinished: 0,
  jobsCalledOff: 0,
  weatherDaysLost: 0,
  jobsCalledOffForWeather: 0,
  costCents: 0,
  machineCents: 0,
  labourCents: 0,
  fuelCents: 0,
  costPerAcreCents: null,
  jobsUnpriced: 0,
  jobsMeasured: 0,
  acresMeasured: 0,
};
