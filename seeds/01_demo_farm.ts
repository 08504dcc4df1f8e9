// The demo farm: Tamarack Ridge Farm, a fictional dryland grain farm (all names and data invented).
import type { Knex } from 'knex';
import { hashPassword } from '../server/auth/passwords';
import accounts from './demo-accounts.json';
import { DEMO_STEPS, type DemoContext } from './steps';

export const DEMO_FARM_NAME = 'Tamarack Ridge Farm';
/** The demo farm keeps Central time: its "today" and "tomorrow" are counted there. */
export const DEMO_TIME_ZONE = 'America/Chicago';

export interface DemoAccount {
  role: 'owner' | 'operator' | 'viewer';
  name: string;
  email: string;
  password: string;
}

export const demoAccounts = accounts as DemoAccount[];

export interface SeedOptions {
  /** Replace the demo farm when it is there already. */
  reset?: boolean;
  /** The instant to load the demo as of: its history ends before that day and its planned days start on it. */
  now?: Date;
}

/** Loads the demo farm unless it is there already; with `reset`, replaces it. Returns the farm id. */
export async function seed(knex: Knex, options: SeedOptions = {}): Promise<number> {
  return knex.transaction(async (tx) => {
    const existing = await tx('farms').where({ name: DEMO_FARM_NAME }).first('id');
    if (existing && !options.reset) return existing.id as number;
    if (existing) {
      await tx('farms').where({ id: existing.id }).delete();
      await tx('users')
        .whereIn(
          'email',
          demoAccounts.map((a) => a.email),
        )
        .delete();
    }
    const [farm] = await tx('farms')
      .insert({ name: DEMO_FARM_NAME, units: 'us', day_hours_limit: 12, time_zone: DEMO_TIME_ZONE })
      .returning('id');
    const ctx: DemoContext = { farmId: farm.id, users: {}, now: options.now ?? new Date() };
    for (const a of demoAccounts) {
      // The app's own cost: a demo account with a cheaper hash would answer a wrong password
      // sooner than an unknown address does (which is compared against a hash of that cost).
      const [user] = await tx('users')
        .insert({ email: a.email, name: a.name, password_hash: await hashPassword(a.password) })
        .onConflict('email')
        .merge()
        .returning('id');
      await tx('memberships').insert({
        farm_id: farm.id,
        user_id: user.id,
        role: a.role,
        status: 'active',
        invited_at: tx.fn.now(),
        joined_at: tx.fn.now(),
      });
      ctx.users[a.email] = user.id;
    }
    for (const step of DEMO_STEPS) await step(tx, ctx);
    return farm.id as number;
  });
}
