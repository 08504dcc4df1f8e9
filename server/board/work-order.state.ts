import type { WorkOrderState } from '../../shared/schemas/board';
import type { DayContext } from './day-context';
import { hashOrder, orderContent, peopleWithJobs, type OrderContent } from './work-order.content';
import type { WorkOrderWithMail } from './work-orders.repository';

export interface OrderPlan {
  membershipId: number;
  name: string;
  email: string;
  kind: 'order' | 'withdrawn';
  hash: string;
  content: OrderContent | null;
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
    const hash = hashOrder(content);
    const prev = last.get(p.membershipId);
    return {
      ...p,
      email: people.get(p.membershipId)?.email ?? '',
      kind: 'order',
      hash,
      content,
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
      last: prev,
      changed: prev.content_hash !== hash,
    });
  }
  return plans.sort((a, b) => a.name.localeCompare(b.name));
}

export const toOrderState = (p: OrderPlan): WorkOrderState => ({
  membershipId: p.membershipId,
  name: p.name,
  status: p.last ? (p.last.mail_status ?? 'none') : 'none',
  sentAt: p.last?.sent_at?.toISOString() ?? null,
  changedSincePublish: !!p.last && p.changed,
  kind: p.last?.kind ?? null,
});
