import { webcrypto } from 'node:crypto';
import { setupZonelessTestEnv } from 'jest-preset-angular/setup-env/zoneless';

setupZonelessTestEnv();

// jsdom lacks matchMedia; the theme and the shell's breakpoint observer ask it.
if (!window.matchMedia) {
  Object.defineProperty(window, 'matchMedia', {
    writable: true,
    value: (query: string): MediaQueryList =>
      ({
        matches: false,
        media: query,
        onchange: null,
        addListener: () => undefined,
        removeListener: () => undefined,
        addEventListener: () => undefined,
        removeEventListener: () => undefined,
        dispatchEvent: () => false,
      }) as MediaQueryList,
  });
}

// jsdom has no structuredClone, which fake-indexeddb stores values with (the values stored in the
// specs are plain JSON), nor crypto.randomUUID, which makes the outbox's event ids.
globalThis.structuredClone ??= (v: unknown) => JSON.parse(JSON.stringify(v));
if (!globalThis.crypto?.randomUUID) Object.defineProperty(globalThis, 'crypto', { value: webcrypto });
