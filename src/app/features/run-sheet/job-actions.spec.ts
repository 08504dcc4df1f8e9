import { job } from '../board/testing/board-fixtures';
import { actionsFor, canReportProblem, finishDefaults, startDefaults } from './job-actions';

describe('actionsFor', () => {
  it.each([
    ['planned', ['start', 'call-off']],
    ['underway', ['pause', 'finish', 'call-off']],
    ['paused', ['resume', 'finish', 'call-off']],
    ['finished', []],
    ['called-off', []],
  ] as const)('when the job is %s, then the operator gets %j', (state, expected) => {
    expect(actionsFor({ state, role: 'operator' })).toEqual(expected);
  });

  it('when the person is the mentor, then there are no log buttons, but a problem can be reported', () => {
    expect(actionsFor({ state: 'underway', role: 'mentor' })).toEqual([]);
    expect(canReportProblem('underway')).toBe(true);
  });

  it('when the job is finished or called off, then no problem can be reported on it', () => {
    expect(canReportProblem('finished')).toBe(false);
    expect(canReportProblem('called-off')).toBe(false);
    expect(canReportProblem('planned')).toBe(true);
  });
});

describe('dialog defaults', () => {
  it('when starting, then the engine hours are the machine meter', () => {
    expect(startDefaults(job())).toEqual({ engineHours: 4210.5 });
  });

  it('when finishing, then the acres are the planned acres and the hours the machine meter', () => {
    expect(finishDefaults(job({ acresPlanned: 120.456 }))).toEqual({ acres: 120.46, engineHours: 4210.5 });
  });

  it('when the start reading is above the machine meter, then the finish starts from the start reading', () => {
    const item = job();
    expect(finishDefaults({ ...item, log: { ...item.log, engineHoursStart: 4215.26 } }).engineHours).toBe(4215.3);
  });
});
