// Fault: a compute task killed at its time or memory limit is answered plainly, and the next task
// is served normally by a fresh worker.
import { createComputePool } from '../../server/compute/pool';
import { AppError } from '../../server/http/errors';
import { combBoundary, squareBoundary } from '../support/hostile-shapes';

const small = { boundary: squareBoundary(400), widthM: 18.288, headingDeg: 0 as const };

async function refusal(p: Promise<unknown>): Promise<AppError> {
  try {
    await p;
  } catch (err) {
    return err as AppError;
  }
  throw new Error('expected the task to be refused');
}

it('when a task runs past its time limit, then it is stopped with a 422 and the next task is served', async () => {
  const pool = createComputePool({ threads: 1, timeLimitMs: 1_500 });
  try {
    const err = await refusal(pool.run('plan', { boundary: combBoundary(2_500), widthM: 3.048, headlandPasses: 2, headingDeg: 'auto' }));
    expect(err).toBeInstanceOf(AppError);
    expect(err.status).toBe(422);
    expect(err.message).toMatch(/longer than 2 s .* stopped it/);
    const next = await pool.run('plan', small);
    expect(next.passCount).toBeGreaterThan(0);
  } finally {
    await pool.close();
  }
}, 60_000);

it('when a task needs more memory than its limit, then its worker is stopped with a 422 and the next task is served', async () => {
  const pool = createComputePool({ threads: 1, memoryLimitMb: 96, timeLimitMs: 60_000 });
  try {
    const err = await refusal(pool.run('plan', { boundary: combBoundary(12_000), widthM: 1.6, headlandPasses: 2, headingDeg: 0 }));
    expect(err.status).toBe(422);
    expect(err.message).toMatch(/more than 96 MB of memory/);
    const next = await pool.run('plan', small);
    expect(next.passCount).toBeGreaterThan(0);
  } finally {
    await pool.close();
  }
}, 90_000);
