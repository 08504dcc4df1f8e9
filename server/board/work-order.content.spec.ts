// Which of the board's warnings a work order repeats, and where.
import type { Conflict } from '../../shared/schemas/board';
import { orderWarnings } from './work-order.content';

const conflict = (code: Conflict['code'], severity: Conflict['severity'], message: string, assignmentIds: number[]): Conflict => ({
  code,
  severity,
  message,
  assignmentIds,
});

describe('orderWarnings', () => {
  const conflicts: Conflict[] = [
    conflict('field_finished', 'soft', 'Home is already finished for harrowing this season', [1]),
    conflict('machine_reported_down', 'soft', '4WD was reported broken down', [2, 9]),
    conflict('over_day_hours', 'soft', 'Tomas has 13.0 h planned, more than the farm’s 12.0 h day', [1, 2]),
    conflict('window_too_short', 'soft', 'Planned 5.0 h does not fit 08:00–10:00 (2.0 h): Home harrowing', [1]),
    conflict('implement_wrong_operation', 'hard', 'Harrow does not do seeding (Home)', [1]),
    conflict('service_overdue', 'soft', 'Other machine is past its service interval', [7]),
  ];

  it('when warnings stand for the jobs, then each job gets its own and the day over its hours is said once for the day', () => {
    expect(orderWarnings(conflicts, [1, 2, 3])).toEqual({
      day: ['Tomas has 13.0 h planned, more than the farm’s 12.0 h day'],
      jobs: [['Home is already finished for harrowing this season'], ['4WD was reported broken down'], []],
    });
  });

  it('when a job has only the window warning (the order says it already) or a hard conflict, then nothing is repeated', () => {
    expect(orderWarnings(conflicts.slice(3, 5), [1])).toEqual({ day: [], jobs: [[]] });
  });

  it('when none of the warnings names the person’s jobs, then the order has none', () => {
    expect(orderWarnings(conflicts, [4])).toEqual({ day: [], jobs: [[]] });
  });
});
