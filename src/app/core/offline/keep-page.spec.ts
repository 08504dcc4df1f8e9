import { keepPageForOffline } from './keep-page';

/** A stand-in for `navigator.serviceWorker`: only what keepPageForOffline reads. */
function container(controlled: boolean): ServiceWorkerContainer {
  const target = new EventTarget() as EventTarget & { controller: object | null };
  target.controller = controlled ? {} : null;
  return target as unknown as ServiceWorkerContainer;
}

describe('keepPageForOffline', () => {
  const realFetch = globalThis.fetch;
  let fetched: string[];

  beforeEach(() => {
    fetched = [];
    globalThis.fetch = jest.fn((url: string | URL | Request) => {
      fetched.push(String(url));
      return Promise.resolve(new Response(''));
    }) as typeof fetch;
  });
  afterEach(() => {
    globalThis.fetch = realFetch;
  });

  it('when the first visit is not yet under the service worker, then the page is fetched once through it when it takes control', () => {
    const sw = container(false);
    keepPageForOffline(sw);
    expect(fetched).toEqual([]);
    sw.dispatchEvent(new Event('controllerchange'));
    sw.dispatchEvent(new Event('controllerchange'));
    expect(fetched).toEqual(['/index.html']);
  });

  it('when the page already came through the service worker, then nothing more is fetched', () => {
    const sw = container(true);
    keepPageForOffline(sw);
    sw.dispatchEvent(new Event('controllerchange'));
    expect(fetched).toEqual([]);
  });

  it('when the browser has no service workers, then nothing happens', () => {
    expect(() => keepPageForOffline(undefined)).not.toThrow();
    expect(fetched).toEqual([]);
  });
});
