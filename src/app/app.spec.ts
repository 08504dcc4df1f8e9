import { provideHttpClient } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { ChangeDetectionStrategy, Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import { App } from './app';
import { AuthStore } from './core/auth/auth-store';
import { KEPT_VIEW_ID, KEPT_VIEW_OPEN_CLASS, closeKeptView } from './core/offline/kept-view';

@Component({ selector: 'app-some-page', changeDetection: ChangeDetectionStrategy.OnPush, template: '<h1>A page</h1>' })
class SomePage {}

/** The copy of the run sheet the phone put on screen before the app started (public/kept-view.js). */
function showCopy(): void {
  const copy = document.createElement('div');
  copy.id = KEPT_VIEW_ID;
  document.body.append(copy);
  document.documentElement.classList.add(KEPT_VIEW_OPEN_CLASS);
}

const copyShown = () => document.getElementById(KEPT_VIEW_ID) !== null && document.documentElement.classList.contains(KEPT_VIEW_OPEN_CLASS);

describe('App', () => {
  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [App],
      providers: [
        provideRouter([
          { path: 'run-sheet', component: SomePage },
          { path: 'sign-in', component: SomePage },
        ]),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    showCopy();
  });
  afterEach(() => closeKeptView());

  it('when the app opens the run sheet, then the copy stays for the run sheet page to replace', async () => {
    TestBed.createComponent(App);
    await TestBed.inject(Router).navigateByUrl('/run-sheet');
    expect(copyShown()).toBe(true);
  });

  it('when the app opens another page (sign-in), then the copy gives way to it', async () => {
    TestBed.createComponent(App);
    await TestBed.inject(Router).navigateByUrl('/sign-in?next=%2Frun-sheet');
    expect(copyShown()).toBe(false);
  });

  it('when the server cannot say who this is, then the copy gives way to the notice', async () => {
    const fixture = TestBed.createComponent(App);
    await TestBed.inject(Router).navigateByUrl('/run-sheet');
    TestBed.inject(AuthStore).unavailable.set('Cannot reach the server');
    await fixture.whenStable();
    expect(copyShown()).toBe(false);
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('Furlong cannot open this page right now');
  });
});
