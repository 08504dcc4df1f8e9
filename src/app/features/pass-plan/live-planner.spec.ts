import { TestBed } from '@angular/core/testing';
import type { PlanInput } from '@shared/plan/types';
import { LivePlanner, PLAN_DEBOUNCE_MS, PLAN_WORKER } from './live-planner';
import type { PlanReply, PlanRequest, PlanWorkerPort } from './plan-messages';
import { SQUARE, planResult } from './plan-fixtures';

class FakeWorker implements PlanWorkerPort {
  sent: PlanRequest[] = [];
  terminated = false;
  onmessage: ((event: MessageEvent<PlanReply>) => void) | null = null;
  onerror: ((event: ErrorEvent) => void) | null = null;
  postMessage(request: PlanRequest): void {
    this.sent.push(request);
  }
  terminate(): void {
    this.terminated = true;
  }
  reply(reply: PlanReply): void {
    this.onmessage?.({ data: reply } as MessageEvent<PlanReply>);
  }
}

const input = (headingDeg: number): PlanInput => ({ boundary: SQUARE, widthM: 18.288, headingDeg });

describe('LivePlanner', () => {
  let worker: FakeWorker;
  let planner: LivePlanner;
  let made: number;

  beforeEach(() => {
    jest.useFakeTimers();
    worker = new FakeWorker();
    made = 0;
    TestBed.configureTestingModule({
      providers: [LivePlanner, { provide: PLAN_WORKER, useValue: () => (made++, worker) }],
    });
    planner = TestBed.inject(LivePlanner);
  });

  afterEach(() => jest.useRealTimers());

  it('when settings change quickly, then only the last one is planned, after the pause', () => {
    planner.request(input(10));
    jest.advanceTimersByTime(PLAN_DEBOUNCE_MS - 20);
    planner.request(input(20));
    jest.advanceTimersByTime(PLAN_DEBOUNCE_MS - 20);
    planner.request(input(30));
    expect(worker.sent).toHaveLength(0);
    expect(planner.state().computing).toBe(true);

    jest.advanceTimersByTime(PLAN_DEBOUNCE_MS);
    expect(worker.sent.map((r) => r.input.headingDeg)).toEqual([30]);
    expect(made).toBe(1);
  });

  it('when an older answer arrives after a newer request, then it is dropped', () => {
    planner.request(input(10));
    jest.advanceTimersByTime(PLAN_DEBOUNCE_MS);
    planner.request(input(20));
    jest.advanceTimersByTime(PLAN_DEBOUNCE_MS);
    const [first, second] = worker.sent;

    worker.reply({ id: first.id, result: planResult({ headingDeg: 10 }) });
    expect(planner.state().result).toBeNull();
    expect(planner.state().computing).toBe(true);

    worker.reply({ id: second.id, result: planResult({ headingDeg: 20 }) });
    expect(planner.state()).toEqual({ result: expect.objectContaining({ headingDeg: 20 }), error: null, computing: false });
  });

  it('when the planner refuses the settings, then its message shows and the last plan is kept', () => {
    planner.request(input(10));
    jest.advanceTimersByTime(PLAN_DEBOUNCE_MS);
    worker.reply({ id: worker.sent[0].id, result: planResult() });

    planner.request(input(20));
    jest.advanceTimersByTime(PLAN_DEBOUNCE_MS);
    worker.reply({ id: worker.sent[1].id, error: 'The working width of 900 ft is wider than field Home Quarter' });
    expect(planner.state().error).toBe('The working width of 900 ft is wider than field Home Quarter');
    expect(planner.state().result).not.toBeNull();
    expect(planner.state().computing).toBe(false);
  });

  it('when the form cannot make an input, then its message shows at once and a late answer is ignored', () => {
    planner.request(input(10));
    jest.advanceTimersByTime(PLAN_DEBOUNCE_MS);
    planner.request(new Error('Enter the working width in feet.'));
    expect(planner.state().error).toBe('Enter the working width in feet.');

    worker.reply({ id: worker.sent[0].id, result: planResult() });
    expect(planner.state().result).toBeNull();
    expect(planner.state().error).toBe('Enter the working width in feet.');
  });

  it('when another field is chosen, then reset forgets the plan and a pending request is not sent', () => {
    planner.request(input(10));
    planner.reset();
    jest.advanceTimersByTime(PLAN_DEBOUNCE_MS * 2);
    expect(worker.sent).toHaveLength(0);
    expect(planner.state()).toEqual({ result: null, error: null, computing: false });
  });

  it('when the worker crashes, then a readable message shows and the next change starts a new worker', () => {
    planner.request(input(10));
    jest.advanceTimersByTime(PLAN_DEBOUNCE_MS);
    worker.onerror?.({ preventDefault: () => undefined } as ErrorEvent);
    expect(planner.state().error).toMatch(/planner stopped/);
    expect(worker.terminated).toBe(true);

    planner.request(input(20));
    jest.advanceTimersByTime(PLAN_DEBOUNCE_MS);
    expect(made).toBe(2);
  });

  it('when the page goes away, then the worker is ended', () => {
    planner.request(input(10));
    jest.advanceTimersByTime(PLAN_DEBOUNCE_MS);
    TestBed.resetTestingModule();
    expect(worker.terminated).toBe(true);
  });
});
