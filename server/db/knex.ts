import fs from 'node:fs';
import path from 'node:path';
import knex, { type Knex } from 'knex';
import pg from 'pg';
import { projectRoot } from '../paths';

// DATE columns are calendar days: keep them as 'YYYY-MM-DD' strings, never shifted by a time zone.
pg.types.setTypeParser(pg.types.builtins.DATE, (v) => v);
// NUMERIC values (acres, hours) come back as numbers; they are well inside double precision.
pg.types.setTypeParser(pg.types.builtins.NUMERIC, (v) => Number(v));
pg.types.setTypeParser(pg.types.builtins.INT8, (v) => Number(v));

export type Db = Knex;
export type Tx = Knex | Knex.Transaction;

const migrationsDir = path.join(projectRoot, 'migrations');

/**
 * Lists migrations by file name without the extension, so the same history is valid whether
 * they run from TypeScript (tsx) or from a compiled build.
 */
class FolderMigrations implements Knex.MigrationSource<string> {
  async getMigrations(): Promise<string[]> {
    return fs
      .readdirSync(migrationsDir)
      .filter((f) => /^\d{14}_[a-z0-9_]+\.(ts|js)$/.test(f))
      .map((f) => f.replace(/\.(ts|js)$/, ''))
      .sort();
  }
  getMigrationName(name: string): string {
    return name;
  }
  async getMigration(name: string): Promise<Knex.Migration> {
    const file = ['.ts', '.js'].map((ext) => path.join(migrationsDir, name + ext)).find((f) => fs.existsSync(f));
    if (!file) throw new Error(`migration ${name} is missing`);
    return (await import(file)) as Knex.Migration;
  }
}

export const migrationConfig: Knex.MigratorConfig = { migrationSource: new FolderMigrations() };

/**
 * A knex instance on PostgreSQL. What happens when the database goes away (checked in
 * tests/faults): knex's pg dialect listens for 'error' and 'end' on every connection it opens
 * and marks the connection disposed, and the pool's validation drops a disposed connection
 * before handing it out, so a lost idle connection never becomes an unhandled 'error' event.
 * A connection attempt gives up after 5 s and waiting for a free one after 10 s, so requests
 * during an outage fail fast (503) instead of queueing for knex's default minute.
 */
export function createDb(url: string, pool: Knex.PoolConfig = { min: 0, max: 10 }): Db {
  return knex({
    client: 'pg',
    connection: { connectionString: url, connectionTimeoutMillis: 5000 },
    pool,
    acquireConnectionTimeout: 10_000,
    // A failed query's message holds the statement but not its bound values (people's data).
    compileSqlOnError: false,
  });
}
