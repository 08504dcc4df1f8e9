import { HttpClient, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import type { Me } from '@shared/schemas/auth';
import { firstValueFrom } from 'rxjs';
import { AuthStore } from '../auth/auth-store';
import { ApiError } from './api-error';
import { OFFLINE_MESSAGE, errorInterceptor } from './error.interceptor';

const ME: Me = {
  user: { id: 1, email: 'ingrid@example.test', name: 'Ingrid Sorensen' },
  farm: { id: 1, name: 'Tamarack Ridge Farm', units: 'us', timeZone: 'America/Chicago' },
  membershipId: 1,
  role: 'owner',
};

describe('errorInterceptor', () => {
  let http: HttpClient;
  let httpTesting: HttpTestingController;
  let router: Router;
  let auth: AuthStore;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideRouter([]), provideHttpClient(withInterceptors([errorInterceptor])), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpClient);
    httpTesting = TestBed.inject(HttpTestingController);
    router = TestBed.inject(Router);
    auth = TestBed.inject(AuthStore);
    auth.signedInAs(ME);
  });

  afterEach(() => httpTesting.verify());

  /** Starts a request and returns what it fails with. */
  function failureOf(url: string): Promise<unknown> {
    return firstValueFrom(http.get(url)).then(
      () => {
        throw new Error('expected the request to fail');
      },
      (error: unknown) => error,
    );
  }

  it('when the error carries more than code, message and fields, then the rest arrives as details', async () => {
    const failure = failureOf('/api/fields/import');
    httpTesting
      .expectOne('/api/fields/import')
      .flush(
        { error: { code: 'import_refused', message: 'Nothing was saved.', problems: ['Feature 2 crosses itself'] } },
        { status: 422, statusText: 'Unprocessable Entity' },
      );
    expect(await failure).toMatchObject({ code: 'import_refused', details: { problems: ['Feature 2 crosses itself'] } });
  });

  it('when the server answers with its error shape, then the ApiError carries its code, message and fields', async () => {
    const failure = failureOf('/api/members');
    httpTesting
      .expectOne('/api/members')
      .flush(
        { error: { code: 'validation', message: 'Check the e-mail address', fields: { email: 'Enter a valid e-mail address' } } },
        { status: 422, statusText: 'Unprocessable Entity' },
      );
    const error = await failure;
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({
      status: 422,
      code: 'validation',
      message: 'Check the e-mail address',
      fields: { email: 'Enter a valid e-mail address' },
    });
  });

  it('when the network fails (status 0), then the message says Furlong cannot be reached', async () => {
    const failure = failureOf('/api/members');
    httpTesting.expectOne('/api/members').error(new ProgressEvent('error'));
    const error = (await failure) as ApiError;
    expect(error).toBeInstanceOf(ApiError);
    expect(error.status).toBe(0);
    expect(error.message).toBe(OFFLINE_MESSAGE);
    expect(error.message).toBe("Cannot reach Furlong's server; your work is not lost. Check the connection and try again.");
    expect(auth.me()).toEqual(ME);
  });

  it('when the service worker could not send the request (a bare 504, no network), then it is the same "cannot reach" as no answer at all', async () => {
    const failure = failureOf('/api/run-sheet');
    // Angular's ngsw-worker.js (safeFetch) answers a fetch that failed with an empty 504 "Gateway Timeout".
    httpTesting.expectOne('/api/run-sheet').flush(null, { status: 504, statusText: 'Gateway Timeout' });
    const error = (await failure) as ApiError;
    expect(error.status).toBe(0);
    expect(error.code).toBe('offline');
    expect(error.message).toBe(OFFLINE_MESSAGE);
    expect(auth.me()).toEqual(ME);
  });

  it('when the database is not answering (503 db_unavailable), then the server message is shown and the person stays signed in', async () => {
    const navigate = jest.spyOn(router, 'navigate').mockResolvedValue(true);
    const message = "The farm's database is not answering; your work is not lost. Try again in a minute.";
    const failure = failureOf('/api/board/2026-07-01');
    httpTesting
      .expectOne('/api/board/2026-07-01')
      .flush({ error: { code: 'db_unavailable', message } }, { status: 503, statusText: 'Service Unavailable' });
    const error = (await failure) as ApiError;
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({ status: 503, code: 'db_unavailable', message });
    expect(auth.me()).toEqual(ME);
    expect(navigate).not.toHaveBeenCalled();
  });

  it('when a failure has no error shape (a proxy page), then a readable message replaces the raw body', async () => {
    const failure = failureOf('/api/members');
    httpTesting.expectOne('/api/members').flush('<html>Bad gateway</html>', { status: 502, statusText: 'Bad Gateway' });
    const error = (await failure) as ApiError;
    expect(error.code).toBe('http_502');
    expect(error.message).not.toContain('<html>');
    expect(error.message).toMatch(/server/);
  });

  it('when any other call answers 401, then the session is cleared and sign-in opens with next', async () => {
    const navigate = jest.spyOn(router, 'navigate').mockResolvedValue(true);
    jest.spyOn(router, 'url', 'get').mockReturnValue('/members');
    const failure = failureOf('/api/members');
    httpTesting
      .expectOne('/api/members')
      .flush({ error: { code: 'unauthenticated', message: 'Sign in first' } }, { status: 401, statusText: 'Unauthorized' });
    const error = (await failure) as ApiError;
    expect(error.message).toBe('Sign in first');
    expect(auth.me()).toBeNull();
    expect(navigate).toHaveBeenCalledWith(['/sign-in'], { queryParams: { next: '/members' } });
  });

  it.each(['/api/auth/me', '/api/auth/login'])(
    'when %s answers 401, then nobody is redirected (it is an answer, not an expiry)',
    async (url) => {
      const navigate = jest.spyOn(router, 'navigate').mockResolvedValue(true);
      const failure = url.endsWith('login') ? firstValueFrom(http.post(url, {})).catch((e: unknown) => e) : failureOf(url);
      httpTesting
        .expectOne(url)
        .flush({ error: { code: 'bad_credentials', message: 'Wrong e-mail or password' } }, { status: 401, statusText: 'Unauthorized' });
      const error = (await failure) as ApiError;
      expect(error.code).toBe('bad_credentials');
      expect(navigate).not.toHaveBeenCalled();
      expect(auth.me()).toEqual(ME);
    },
  );
});
