import { job } from '../board/testing/board-fixtures';
import { actionsFor, canReportProblem, finishDefaults, startDefaults, withUnsent } from './job-actions';

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

describe('withUnsent', () => {
  const id = (n: number) => `00000000-0000-4000-8000-00000000000${n}`;

  it('when a start and a finish wait on the phone, then the job previews finished with their readings, each log entry marked unsent', () => {
    const item = job({ state: 'planned', acresPlanned: 150 });
    const shown = withUnsent(item, [
      { type: 'start', at: '2031-05-15T13:00:00.000Z', engineHours: 4211, clientEventId: id(1) },
      { type: 'finish', at: '2031-05-15T18:40:00.000Z', acres: 142.5, engineHours: 4218.4, clientEventId: id(2) },
    ]);
    expect(shown.state).toBe('finished');
    expect(shown.log).toMatchObject({ engineHoursStart: 4211, engineHoursEnd: 4218.4, acresDone: 142.5 });
    expect(shown.events.map((e) => [e.type, e.at, e.unsent])).toEqual([
      ['start', '2031-05-15T13:00:00.000Z', true],
      ['finish', '2031-05-15T18:40:00.000Z', true],
    ]);
    // The server's copy is left as it was.
    expect(item.state).toBe('planned');
  });

  it('when a start waits, then a finish dialog starts from that start reading, not the machine meter', () => {
    const shown = withUnsent(job({ state: 'planned' }), [
      { type: 'start', at: '2031-05-15T13:00:00.000Z', engineHours: 4300, clientEventId: id(1) },
    ]);
    expect(finishDefaults(shown).engineHours).toBe(4300);
  });

  it('when a step the job cannot take waits (resume on a planned job), then the state stays and the entry still shows as unsent', () => {
    const shown = withUnsent(job({ state: 'planned' }), [{ type: 'resume', at: '2031-05-15T13:00:00.000Z', clientEventId: id(1) }]);
    expect(shown.state).toBe('planned');
    expect(shown.events.at(-1)).toMatchObject({ type: 'resume', unsent: true });
  });

  it('when nothing waits, then the job is the server copy itself', () => {
    const item = job();
    expect(withUnsent(item, [])).toBe(item);
  });
});
