import type { OrderChanges, WorkOrderState } from '../../shared/schemas/board';
import type { DayContext } from './day-context';
import { hashOrder, jobsOf, orderContent, orderMarks, peopleWithJobs, type OrderContent, type OrderJobMark } from './work-order.content';
import type { WorkOrderWithMail } from './work-orders.repository';

export interface OrderPlan {
  membershipId: number;
  name: string;
  email: string;
  kind: 'order' | 'withdrawn';
  hash: string;
  content: OrderContent | null;
  /** Per job of `content`, what is kept to tell later what changed (empty for a withdrawal). */
  marks: OrderJobMark[];
  last: WorkOrderWithMail | undefined;
  /** Differs from what was last published (or was never published). */
  changed: boolean;
}

/**
 * For each person who has jobs that day, or had an order when it was last published, what
 * their order would say now and whether that differs from the one last mailed. Someone who
 * had an order and now has no jobs gets a withdrawal.
 */
export function planOrders(ctx: DayContext, published: WorkOrderWithMail[], publicUrl: string): OrderPlan[] {
  const last = new Map(published.map((o) => [o.membership_id, o]));
  const people = new Map(ctx.people.map((p) => [p.membership_id, p]));
  const withJobs = peopleWithJobs(ctx);
  const plans: OrderPlan[] = withJobs.map((p) => {
    const content = orderContent(ctx, p, publicUrl);
    const marks = orderMarks(jobsOf(ctx, p), content.jobs);
    const hash = hashOrder(content);
    const prev = last.get(p.membershipId);
    return {
      ...p,
      email: people.get(p.membershipId)?.email ?? '',
      kind: 'order',
      hash,
      content,
      marks,
      last: prev,
      changed: !prev || prev.content_hash !== hash,
    };
  });
  const busy = new Set(withJobs.map((p) => p.membershipId));
  for (const prev of published.filter((o) => !busy.has(o.membership_id))) {
    const person = people.get(prev.membership_id);
    const hash = hashOrder({ withdrawn: ctx.day });
    plans.push({
      membershipId: prev.membership_id,
      name: person?.name ?? '',
      email: person?.email ?? '',
      kind: 'withdrawn',
      hash,
      content: null,
      marks: [],
      last: prev,
      changed: prev.content_hash !== hash,
    });
  }
  return plans.sort((a, b) => a.name.localeCompare(b.name));
}

/**
 * What changed in a person's jobs between the order last published and the order now: jobs new to
 * it, at another time or place in the day, otherwise different (one that is both counts as
 * edited), and gone. Null when the published order kept no marks (published before they were kept).
 */
export function changesBetween(published: readonly OrderJobMark[] | null, now: readonly OrderJobMark[]): OrderChanges | null {
  if (!published) return null;
  const before = new Map(published.map((m) => [m.id, m]));
  const out: OrderChanges = { added: 0, moved: 0, edited: 0, removed: 0 };
  for (const m of now) {
    const was = before.get(m.id);
    if (!was) out.added++;
    else if (was.body !== m.body) out.edited++;
    else if (was.at !== m.at) out.moved++;
  }
  const still = new Set(now.map((m) => m.id));
  out.removed = published.filter((m) => !still.has(m.id)).length;
  return out;
}

export const toOrderState = (p: OrderPlan): WorkOrderState => ({
  membershipId: p.membershipId,
  name: p.name,
  status: p.last ? (p.last.mail_status ?? 'none') : 'none',
  sentAt: p.last?.sent_at?.toISOString() ?? null,
  changedSincePublish: !!p.last && p.changed,
  changes: p.last && p.changed ? changesBetween(p.last.jobs, p.marks) : null,
  kind: p.last?.kind ?? null,
});
