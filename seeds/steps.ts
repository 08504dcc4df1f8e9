import type { Knex } from 'knex';
import { seedDemoFields } from './02_demo_fields';
import { seedDemoFleetCrew } from './03_demo_fleet_crew';

/** What each demo step gets: the new farm and the demo people's user ids by e-mail. */
export interface DemoContext {
  farmId: number;
  users: Record<string, number>;
}

export type DemoStep = (tx: Knex.Transaction, ctx: DemoContext) => Promise<void>;

/** The demo farm's contents, loaded in this order after the farm and its people. */
export const DEMO_STEPS: DemoStep[] = [seedDemoFields, seedDemoFleetCrew];
