import { DateTime } from 'luxon';
import { ApiError } from '../../core/http/api-error';
import { describeChanges, staleBoardOf } from './stale-board';
import { board } from './testing/board-fixtures';

describe('staleBoardOf', () => {
  const current = board([], { version: 9 });
  const changes = [
    { version: 9, at: '2031-05-14T19:05:00Z', by: 'Ingrid Sorensen', summary: 'Moved 1 job between operators', assignmentIds: [3] },
  ];

  it('when the server answers 409 stale_board, then the current board and the changes come out', () => {
    const stale = staleBoardOf(new ApiError(409, 'stale_board', 'Someone else saved first', {}, { changes, current }));
    expect(stale?.current.version).toBe(9);
    expect(stale?.changes).toEqual(changes);
    expect(stale?.message).toBe('Someone else saved first');
  });

  it('when it is any other failure, or a 409 without a board, then it is not a stale board', () => {
    expect(staleBoardOf(new ApiError(409, 'hard_conflicts', 'Fix the conflicts'))).toBeNull();
    expect(staleBoardOf(new ApiError(409, 'stale_board', 'x', {}, { changes }))).toBeNull();
    expect(staleBoardOf(new ApiError(422, 'stale_board', 'x', {}, { current }))).toBeNull();
    expect(staleBoardOf(new Error('boom'))).toBeNull();
  });

  it('when changes are described, then each reads who did what, oldest first', () => {
    const lines = describeChanges([{ ...changes[0], version: 10, summary: 'Published' }, changes[0]], 'America/Chicago');
    expect(lines).toHaveLength(2);
    expect(lines[0]).toMatch(/^\d\d:\d\d Ingrid Sorensen: Moved 1 job between operators$/);
    expect(lines[1]).toMatch(/Published$/);
  });

  it("when changes are described, then their times are the farm's clock, not the machine's", () => {
    // luxon with IANA zone data: 19:05 UTC in May is 14:05 CDT in Chicago and 13:05 CST in Regina.
    for (const zone of ['America/Chicago', 'America/Regina']) {
      const expected = DateTime.fromISO(changes[0].at, { zone }).toFormat('HH:mm');
      expect(describeChanges(changes, zone)).toEqual([`${expected} Ingrid Sorensen: Moved 1 job between operators`]);
    }
    expect(describeChanges(changes, 'America/Regina')[0]).toMatch(/^13:05 /);
  });
});
