import { provideHttpClient, withInterceptors } from '@angular/common/http';
import {
  type ApplicationConfig,
  inject,
  isDevMode,
  provideAppInitializer,
  provideBrowserGlobalErrorListeners,
  provideZonelessChangeDetection,
} from '@angular/core';
import { MatIconRegistry } from '@angular/material/icon';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { provideServiceWorker } from '@angular/service-worker';
import { routes } from './app.routes';
import { AuthStore } from './core/auth/auth-store';
import { errorInterceptor } from './core/http/error.interceptor';
import { keepPageForOffline } from './core/offline/keep-page';

export const appConfig: ApplicationConfig = {
  providers: [
    provideBrowserGlobalErrorListeners(),
    provideZonelessChangeDetection(),
    provideRouter(routes, withComponentInputBinding()),
    // XSRF stays on (the default): the XSRF-TOKEN cookie goes back as X-XSRF-TOKEN on writes.
    provideHttpClient(withInterceptors([errorInterceptor])),
    provideAppInitializer(() => {
      // The bundled Material Symbols font, through the ligature class in styles.scss.
      inject(MatIconRegistry).setDefaultFontSetClass('material-symbols-outlined');
    }),
    provideAppInitializer(() => inject(AuthStore).load()),
    // The app shell, fonts and icons stay on the device (ngsw-config.json), so a phone that opened
    // Furlong once opens it again with no signal. Production builds only: `ng serve` rebuilds too often.
    // furlong-sw.js is Angular's worker (it imports ngsw-worker.js) with the outbox's Background Sync.
    provideServiceWorker('furlong-sw.js', { enabled: !isDevMode(), registrationStrategy: 'registerWhenStable:5000' }),
    provideAppInitializer(keepPageForOffline),
  ],
};
