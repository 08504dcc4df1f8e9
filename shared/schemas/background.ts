import * as z from 'zod';

/** A background job that failed for good (a dead letter), as the owner's list shows it. */
export const failedJob = z.object({
  id: z.string().uuid(),
  /** The queue (server/background/queue.ts). Weather jobs carry no `farmId`, so the list shows mail only. */
  queue: z.enum(['mail', 'weather']),
  /** What the job was for, in words: "Work order e-mail". */
  what: z.string(),
  /** For mail: the address and subject. */
  to: z.string().nullable(),
  subject: z.string().nullable(),
  attempts: z.number().int(),
  failedAt: z.string(),
  /** The last reason, as the mail server or service gave it. */
  error: z.string().nullable(),
});
export type FailedJob = z.infer<typeof failedJob>;

export const failedJobList = z.object({ jobs: z.array(failedJob) });
export type FailedJobList = z.infer<typeof failedJobList>;

export const jobIdParam = z.object({ id: z.string().uuid('That is not a job id') });
