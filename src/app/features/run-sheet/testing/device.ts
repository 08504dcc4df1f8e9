// For specs: a phone's storage and connection. Each spec starts on a fresh IndexedDB (the
// fake-indexeddb package speaks the real IndexedDB API) and says whether there is a signal.
// The auto import puts IDBRequest, IDBKeyRange and the rest on the global, as a browser has them.
import 'fake-indexeddb/auto';
import { IDBFactory } from 'fake-indexeddb';

/** A fresh, empty IndexedDB for the code under test (idb opens through the global). */
export function freshDeviceStorage(): void {
  Object.defineProperty(globalThis, 'indexedDB', { value: new IDBFactory(), configurable: true, writable: true });
}

/** Sets `navigator.onLine`; the `online` event is the test's to send when it matters. */
export function setOnline(online: boolean): void {
  Object.defineProperty(navigator, 'onLine', { get: () => online, configurable: true });
}

/** Waits (checking every few milliseconds, up to two seconds) until `check` holds; IndexedDB answers on its own clock. */
export async function until(check: () => boolean, what: string, tick: () => void = () => undefined): Promise<void> {
  for (let i = 0; i < 400; i++) {
    tick();
    if (check()) return;
    await new Promise((r) => setTimeout(r, 5));
  }
  throw new Error(`Still waiting for: ${what}`);
}
