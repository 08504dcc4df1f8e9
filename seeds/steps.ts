import type { Knex } from 'knex';
import { seedDemoFields } from './02_demo_fields';
import { seedDemoFleetCrew } from './03_demo_fleet_crew';
import { seedDemoCosts } from './04_demo_costs';

/**
 * What each demo step gets: the new farm, the demo people's user ids by e-mail, and the instant the
 * demo is loaded as of (the real clock unless a test says otherwise; its day is counted in the farm's
 * time zone).
 */
export interface DemoContext {
  farmId: number;
  users: Record<string, number>;
  now?: Date;
}

export type DemoStep = (tx: Knex.Transaction, ctx: DemoContext) => Promise<void>;

/** The demo farm's contents, loaded in this order after the farm and its people. */
export const DEMO_STEPS: DemoStep[] = [seedDemoFields, seedDemoFleetCrew, seedDemoCosts];
