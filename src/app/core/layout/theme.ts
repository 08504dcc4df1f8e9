import { DOCUMENT, Injectable, computed, effect, inject, signal } from '@angular/core';

export type ThemeMode = 'light' | 'dark';

export const THEME_STORAGE_KEY = 'furlong.theme';

/**
 * Light for the office, dark for night work in a cab. Follows the system until the person picks
 * one; the pick is remembered in this browser.
 */
@Injectable({ providedIn: 'root' })
export class ThemeStore {
  private readonly document = inject(DOCUMENT);
  private readonly window = this.document.defaultView;
  private readonly systemDark = signal(this.prefersDark());
  private readonly chosen = signal<ThemeMode | null>(this.readChoice());

  readonly mode = computed<ThemeMode>(() => this.chosen() ?? (this.systemDark() ? 'dark' : 'light'));
  readonly isDark = computed(() => this.mode() === 'dark');

  constructor() {
    this.window?.matchMedia?.('(prefers-color-scheme: dark)')?.addEventListener?.('change', (event) => this.systemDark.set(event.matches));
    effect(() => {
      const mode = this.mode();
      const root = this.document.documentElement;
      root.classList.toggle('dark-theme', mode === 'dark');
      root.classList.toggle('light-theme', mode === 'light');
    });
  }

  toggle(): void {
    const next: ThemeMode = this.isDark() ? 'light' : 'dark';
    this.chosen.set(next);
    try {
      this.window?.localStorage.setItem(THEME_STORAGE_KEY, next);
    } catch {
      // Storage can be unavailable (private mode); the choice then lasts for this visit.
    }
  }

  private prefersDark(): boolean {
    return this.window?.matchMedia?.('(prefers-color-scheme: dark)')?.matches ?? false;
  }

  private readChoice(): ThemeMode | null {
    try {
      const stored = this.window?.localStorage.getItem(THEME_STORAGE_KEY);
      return stored === 'light' || stored === 'dark' ? stored : null;
    } catch {
      return null;
    }
  }
}
