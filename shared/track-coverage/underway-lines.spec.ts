import { linesWhileUnderway, underwaySpans } from './underway-lines';

// Hand-made logs: the spans follow from the state machine's steps (start → pause → resume → finish).
describe('underwaySpans', () => {
  it('when a job was started, paused, resumed and finished, then it was underway in two spans', () => {
    const steps = [
      { type: 'finish', at: 50 },
      { type: 'start', at: 0 },
      { type: 'resume', at: 30 },
      { type: 'pause', at: 10 },
    ];
    expect(underwaySpans(steps)).toEqual([
      [0, 10],
      [30, 50],
    ]);
  });

  it('when a job is still underway, then its last span has no end', () => {
    expect(underwaySpans([{ type: 'start', at: 5 }])).toEqual([[5, Infinity]]);
  });

  it('when a job was never started, then it has no span', () => {
    expect(underwaySpans([{ type: 'call-off', at: 5 }])).toEqual([]);
  });
});

describe('linesWhileUnderway', () => {
  const pt = (t: number) => ({ lon: t / 1000, lat: 47, t });

  it('when points fall before the start, during a pause and after the finish, then only those while underway are kept, a line per span, all working', () => {
    const points = [pt(-5), pt(0), pt(4), pt(8), pt(12), pt(20), pt(30), pt(35), pt(40), pt(60)].reverse();
    const steps = [
      { type: 'start', at: 0 },
      { type: 'pause', at: 10 },
      { type: 'resume', at: 30 },
      { type: 'finish', at: 40 },
    ];
    const lines = linesWhileUnderway(points, steps);
    expect(lines.map((l) => l.map((p) => p.t))).toEqual([
      [0, 4, 8],
      [30, 35, 40],
    ]);
    expect(lines.flat().every((p) => p.working === true)).toBe(true);
  });

  it('when a span holds a single point, then it makes no line', () => {
    expect(linesWhileUnderway([pt(1)], [{ type: 'start', at: 0 }])).toEqual([]);
  });
});
