import { judgeInOrder } from './state-machine';

// The expected outcomes are worked by hand from the transition table in state-machine.ts
// (start: planned → underway; pause: underway → paused; resume: paused → underway; finish:
// underway or paused → finished; call-off: not from finished or called-off).
const t = (hhmm: string) => new Date(`2026-05-01T${hhmm}:00Z`);

describe('judgeInOrder', () => {
  it('when a pause tapped at 16:00 arrives after the finish tapped at 16:40, then it fits before the finish and the job stays finished', () => {
    const log = [
      { type: 'start', at: t('08:00') },
      { type: 'finish', at: t('16:40') },
    ];
    expect(judgeInOrder(log, { type: 'pause', at: t('16:00') })).toEqual({
      ok: true,
      state: 'finished',
      late: true,
      startedAt: t('08:00'),
      finishedAt: t('16:40'),
    });
  });

  it('when a finish tapped at 16:30 arrives after another finish at 16:40, then the logged finish no longer fits and it is refused', () => {
    const log = [
      { type: 'start', at: t('08:00') },
      { type: 'finish', at: t('16:40') },
    ];
    const finish = { type: 'finish' as const, at: t('16:30') };
    expect(judgeInOrder(log, finish)).toEqual({
      ok: false,
      late: true,
      state: 'finished',
      failing: log[1],
      after: finish,
    });
  });

  it('when a resume comes with no pause before it, then it is refused at the resume itself', () => {
    const log = [{ type: 'start', at: t('08:00') }];
    const resume = { type: 'resume' as const, at: t('09:00') };
    expect(judgeInOrder(log, resume)).toMatchObject({ ok: false, late: false, state: 'underway', failing: resume, after: log[0] });
  });

  it('when the newest tap comes last, then it is not late, and problems and corrections in the log are passed over', () => {
    const log = [
      { type: 'start', at: t('08:00') },
      { type: 'problem', at: t('09:00') },
      { type: 'pause', at: t('09:01') },
    ];
    expect(judgeInOrder(log, { type: 'resume', at: t('10:00') })).toMatchObject({ ok: true, late: false, state: 'underway' });
  });

  it('when the owner deleted the log, then only what follows counts: a start after it is a fresh start', () => {
    const log = [
      { type: 'start', at: t('08:00') },
      { type: 'finish', at: t('12:00') },
      { type: 'log-deleted', at: t('13:00') },
    ];
    expect(judgeInOrder(log, { type: 'start', at: t('14:00') })).toMatchObject({ ok: true, state: 'underway', startedAt: t('14:00') });
  });

  it('when two entries have the same time, then the new one goes after the logged one', () => {
    const log = [{ type: 'start', at: t('08:00') }];
    expect(judgeInOrder(log, { type: 'pause', at: t('08:00') })).toMatchObject({ ok: true, late: false, state: 'paused' });
  });
});
