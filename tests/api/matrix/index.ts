// Each feature keeps its rows of the authorization matrix in a file of its own here.
import { board } from './board';
import { costs } from './costs';
import { customers } from './customers';
import { rateCard } from './rate-card';
import { invoices } from './invoices';
import { fields } from './fields';
import { foundation } from './foundation';
import { openapi } from './openapi';
import { plans } from './plans';
import { season } from './season';
import { taskdata } from './taskdata';
import { phoneTrack, trackCoverage } from './track-coverage';
import type { Case } from './types';
import { payments } from './payments';
import { weather } from './weather';

export const MATRIX: Record<string, Case> = {
  ...foundation,
  ...fields,
  ...plans,
  ...board,
  ...season,
  ...weather,
  ...costs,
  ...customers,
  ...rateCard,
  ...invoices,
  ...payments,
  ...taskdata,
  ...trackCoverage,
  ...phoneTrack,
  ...openapi,
};
export type { Who } from './types';
