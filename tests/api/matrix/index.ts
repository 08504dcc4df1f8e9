// Each feature keeps its rows of the authorization matrix in a file of its own here.
import { board } from './board';
import { fields } from './fields';
import { foundation } from './foundation';
import { openapi } from './openapi';
import { plans } from './plans';
import { season } from './season';
import type { Case } from './types';
import { weather } from './weather';

export const MATRIX: Record<string, Case> = { ...foundation, ...fields, ...plans, ...board, ...season, ...weather, ...openapi };
export type { Who } from './types';
