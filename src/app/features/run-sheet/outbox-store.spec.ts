import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, type TestRequest, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { Me } from '@shared/schemas/auth';
import { AuthStore } from '../../core/auth/auth-store';
import { errorInterceptor } from '../../core/http/error.interceptor';
import { OUTBOX_SEND_WAIT_MS, OutboxStore } from './outbox-store';
import { freshDeviceStorage, setOnline, until } from './testing/device';

const TOMAS_ME: Me = {
  user: { id: 2, email: 't@example.test', name: 'Tomas Reyes' },
  farm: { id: 1, name: 'F', units: 'us', timeZone: 'America/Chicago' },
  membershipId: 5,
  role: 'operator',
};

describe('OutboxStore on a weak signal', () => {
  beforeEach(() => {
    freshDeviceStorage();
    setOnline(true);
    TestBed.configureTestingModule({
      providers: [
        provideRouter([]),
        provideHttpClient(withInterceptors([errorInterceptor])),
        provideHttpClientTesting(),
        { provide: OUTBOX_SEND_WAIT_MS, useValue: 50 },
      ],
    });
    TestBed.inject(AuthStore).signedInAs(TOMAS_ME);
  });

  it('when a send gets no answer within the wait, then it is given up on, the action stays on the phone and is sent again with the same id, and goes once answered', async () => {
    const store = TestBed.inject(OutboxStore);
    const http = TestBed.inject(HttpTestingController);
    const entry = await store.tap(7, { type: 'start', engineHours: 4211 }, new Date('2031-05-15T13:00:00Z'));

    let first: TestRequest | undefined;
    await until(() => (first = http.match('/api/run-sheet/outbox')[0]) !== undefined, 'the first send');
    // No answer, no failure: after the wait the send is given up on; the action is still waiting.
    await until(() => first!.cancelled, 'the first send given up');
    expect(store.entries().map((e) => e.clientEventId)).toEqual([entry.clientEventId]);

    // Sent again after the sender's first retry delay (1 s), as the same action.
    let second: TestRequest | undefined;
    await until(() => (second = http.match('/api/run-sheet/outbox')[0]) !== undefined, 'the send again');
    const events = (second!.request.body as { events: Array<{ clientEventId: string; assignmentId: number; type: string }> }).events;
    expect(events).toEqual([expect.objectContaining({ clientEventId: entry.clientEventId, assignmentId: 7, type: 'start' })]);
    second!.flush({ results: [{ status: 201, body: null }] });
    await until(() => store.entries().length === 0, 'the action sent');
    expect(store.line()).toMatch(/^All sent \d\d:\d\d$/);
    http.verify();
  });
});
