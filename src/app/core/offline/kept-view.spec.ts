import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { Me } from '@shared/schemas/auth';
import { SIGNED_IN_KEY } from '../auth/auth-store';
import {
  KEPT_VIEW_ID,
  KEPT_VIEW_KEY,
  KEPT_VIEW_MAX_CHARS,
  KEPT_VIEW_OPEN_CLASS,
  closeKeptView,
  keepView,
  type KeptView,
} from './kept-view';

// The script the page runs before the app's code (src/public/kept-view.js), run here as the page
// would: as it is, in this document.
const SCRIPT = readFileSync(path.resolve(__dirname, '../../../public/kept-view.js'), 'utf8');
const runScript = () => new Function(SCRIPT)();

const me = (userId = 7, farmId = 3, timeZone = 'America/Regina'): Me => ({
  membershipId: 11,
  role: 'operator',
  user: { id: userId, name: 'Ada Test', email: 'ada@furlong.test' },
  farm: { id: farmId, name: 'Test Farm', units: 'us', timeZone },
});

/** A page as the app leaves it: its component styles in <head>, the run sheet inside <app-root>. */
function drawApp(): Element {
  document.head.innerHTML = '<style nonce="n1">.job[_ngcontent-a] { color: green; }</style>';
  document.body.innerHTML =
    '<app-root ngCspNonce="page-nonce"><main><h1>Run sheet</h1><p class="job" _ngcontent-a>1. North Quarter · Seeding</p>' +
    '<div class="bar" style="width: 40%;"></div><svg class="icon"><style>.a { fill: red; }</style></svg><mat-progress-bar>loading</mat-progress-bar><input type="date"><textarea></textarea></main></app-root>';
  document.querySelector('input')!.value = '2026-12-04';
  document.querySelector('textarea')!.value = 'Rock at the NE corner';
  return document.querySelector('app-root')!;
}

/** An empty page again, as the server sends it: only <app-root> (the nonce written in). */
function freshPage(): void {
  document.head.innerHTML = '';
  document.body.innerHTML = '<app-root ngCspNonce="page-nonce"></app-root>';
  document.documentElement.className = '';
}

describe('the run sheet kept as drawn', () => {
  let online: jest.SpyInstance<boolean, []>;

  beforeEach(() => {
    localStorage.clear();
    window.history.pushState({}, '', '/run-sheet');
    online = jest.spyOn(navigator, 'onLine', 'get').mockReturnValue(false);
    jest.useFakeTimers({ doNotFake: ['queueMicrotask'] });
    // America/Regina keeps UTC−6 all year, with no daylight saving (IANA time zone database, via the
    // runtime's ICU): 15:30 UTC is 09:30 at the farm.
    jest.setSystemTime(new Date('2026-12-04T15:30:00Z'));
  });
  afterEach(() => {
    jest.useRealTimers();
    online.mockRestore();
    closeKeptView();
    document.documentElement.className = '';
  });

  it('keeps the markup with typed values written in and the page styles, without loading bars', () => {
    const root = drawApp();
    expect(keepView(me(), root)).toBe(true);
    const kept = JSON.parse(localStorage.getItem(KEPT_VIEW_KEY)!) as KeptView;
    expect(kept).toMatchObject({ v: 1, userId: 7, farmId: 3, at: '2026-12-04T15:30:00.000Z' });
    expect(kept.css).toEqual(['.job[_ngcontent-a] { color: green; }']);
    expect(kept.html).toContain('1. North Quarter · Seeding');
    expect(kept.html).toContain('value="2026-12-04"');
    expect(kept.html).toContain('<textarea>Rock at the NE corner</textarea>');
    expect(kept.html).not.toContain('mat-progress-bar');
    // Style attributes travel as data: the page's policy would refuse them in markup.
    expect(kept.html).toContain('<div class="bar" data-kept-style="width: 40%;"></div>');
    // So do <style> elements in markup (an icon's SVG), under another name.
    expect(kept.html).toContain('<svg class="icon"><furlong-kept-style>.a { fill: red; }</furlong-kept-style></svg>');
    expect(kept.html).not.toContain('<style');
    // The page itself is left as it was.
    expect(root.querySelector('mat-progress-bar')).not.toBeNull();
  });

  it('keeps nothing larger than the limit, and drops the older copy so a stale day never shows', () => {
    const root = drawApp();
    keepView(me(), root);
    root.querySelector('main')!.append('x'.repeat(KEPT_VIEW_MAX_CHARS));
    expect(keepView(me(), root)).toBe(false);
    expect(localStorage.getItem(KEPT_VIEW_KEY)).toBeNull();
  });

  it('with no connection, the script shows the copy at once: read-only, under its note, the app drawing out of sight', () => {
    keepView(me(), drawApp());
    localStorage.setItem(SIGNED_IN_KEY, JSON.stringify(me()));
    freshPage();
    runScript();
    const box = document.getElementById(KEPT_VIEW_ID)!;
    expect(box).not.toBeNull();
    expect(box.nextElementSibling?.tagName).toBe('APP-ROOT');
    // A long day scrolls: a labelled region the keyboard can reach.
    expect([box.getAttribute('role'), box.getAttribute('aria-label'), box.tabIndex]).toEqual(['region', 'Run sheet kept on this phone', 0]);
    // Kept at 15:30 UTC: 09:30 at the farm (America/Regina keeps UTC−6 all year).
    expect(box.querySelector('[data-kept-view-note]')?.textContent).toBe('Opening: the run sheet kept on this phone, as of 09:30.');
    const copy = box.querySelector('.kept-view-copy')!;
    expect(copy.hasAttribute('inert')).toBe(true);
    expect(copy.textContent).toContain('1. North Quarter · Seeding');
    // Set through the DOM, as the page's policy allows.
    const bar = copy.querySelector<HTMLElement>('.bar')!;
    expect(bar.style.width).toBe('40%');
    expect(bar.hasAttribute('data-kept-style')).toBe(false);
    // An icon's own <style>, made again in the SVG with the page's nonce.
    const iconStyle = copy.querySelector('svg.icon > style') as SVGStyleElement;
    expect(iconStyle.namespaceURI).toBe('http://www.w3.org/2000/svg');
    expect(iconStyle.textContent).toBe('.a { fill: red; }');
    expect(iconStyle.nonce).toBe('page-nonce');
    expect(copy.querySelector('furlong-kept-style')).toBeNull();
    const styles = [...document.head.querySelectorAll('style[data-kept-view]')] as HTMLStyleElement[];
    expect(styles.map((s) => s.textContent)).toEqual(['.job[_ngcontent-a] { color: green; }']);
    // The page's policy admits styles with this page's nonce, not the one they were drawn with.
    expect(styles[0].nonce).toBe('page-nonce');
    expect(document.documentElement.classList.contains(KEPT_VIEW_OPEN_CLASS)).toBe(true);

    closeKeptView();
    expect(document.getElementById(KEPT_VIEW_ID)).toBeNull();
    expect(document.head.querySelectorAll('style[data-kept-view]')).toHaveLength(0);
    expect(document.documentElement.classList.contains(KEPT_VIEW_OPEN_CLASS)).toBe(false);
  });

  it('gives way by itself when the app never takes over', () => {
    keepView(me(), drawApp());
    localStorage.setItem(SIGNED_IN_KEY, JSON.stringify(me()));
    freshPage();
    runScript();
    expect(document.getElementById(KEPT_VIEW_ID)).not.toBeNull();
    jest.advanceTimersByTime(15000);
    expect(document.getElementById(KEPT_VIEW_ID)).toBeNull();
    expect(document.documentElement.classList.contains(KEPT_VIEW_OPEN_CLASS)).toBe(false);
  });

  const notShown: [string, () => void][] = [
    ['with a connection (the app opens the day from the server)', () => online.mockReturnValue(true)],
    ['for another person signed in on this phone', () => localStorage.setItem(SIGNED_IN_KEY, JSON.stringify(me(8)))],
    ['with nobody signed in on this phone', () => localStorage.removeItem(SIGNED_IN_KEY)],
    ['on another page', () => window.history.pushState({}, '', '/board')],
    ['for another day asked in the address', () => window.history.pushState({}, '', '/run-sheet?date=2026-12-05')],
    // 06:10 UTC on the 5th is 00:10 on the 5th in Regina: a new day at the farm.
    ['the next day at the farm', () => jest.setSystemTime(new Date('2026-12-05T06:10:00Z'))],
    ['from a copy that does not read', () => localStorage.setItem(KEPT_VIEW_KEY, '{not json')],
  ];
  it.each(notShown)('does not show the copy %s', (_, change) => {
    keepView(me(), drawApp());
    localStorage.setItem(SIGNED_IN_KEY, JSON.stringify(me()));
    freshPage();
    change();
    runScript();
    expect(document.getElementById(KEPT_VIEW_ID)).toBeNull();
    expect(document.head.querySelectorAll('style[data-kept-view]')).toHaveLength(0);
    expect(document.documentElement.classList.contains(KEPT_VIEW_OPEN_CLASS)).toBe(false);
  });

  it('does not show a copy from the day before at the farm, though it is the same day in UTC', () => {
    jest.setSystemTime(new Date('2026-12-04T05:00:00Z')); // 23:00 on the 3rd in Regina
    keepView(me(), drawApp());
    localStorage.setItem(SIGNED_IN_KEY, JSON.stringify(me()));
    freshPage();
    jest.setSystemTime(new Date('2026-12-04T07:00:00Z')); // 01:00 on the 4th in Regina
    runScript();
    expect(document.getElementById(KEPT_VIEW_ID)).toBeNull();
  });

  it('still shows late the same evening at the farm, though it is the next day in UTC', () => {
    jest.setSystemTime(new Date('2026-12-04T20:00:00Z')); // 14:00 on the 4th in Regina
    keepView(me(), drawApp());
    localStorage.setItem(SIGNED_IN_KEY, JSON.stringify(me()));
    freshPage();
    jest.setSystemTime(new Date('2026-12-05T05:50:00Z')); // 23:50 on the 4th in Regina
    runScript();
    expect(document.querySelector('[data-kept-view-note]')?.textContent).toBe('Opening: the run sheet kept on this phone, as of 14:00.');
  });

  it('takes the theme the person picked on this phone, and none when they picked none', () => {
    keepView(me(), drawApp());
    localStorage.setItem(SIGNED_IN_KEY, JSON.stringify(me()));
    freshPage();
    runScript();
    expect(document.documentElement.className).toBe(KEPT_VIEW_OPEN_CLASS);
    closeKeptView();
    freshPage();
    localStorage.setItem('furlong.theme', 'dark');
    runScript();
    expect(document.documentElement.classList.contains('dark-theme')).toBe(true);
    localStorage.removeItem('furlong.theme');
  });

  it('puts back only markup: whatever else the storage holds cannot act on the page', () => {
    localStorage.setItem(SIGNED_IN_KEY, JSON.stringify(me()));
    const hostile =
      '<h1>Run sheet</h1><script>window.ran = true</script><img src="x.png" onerror="window.ran = true">' +
      '<meta http-equiv="refresh" content="0; url=/elsewhere"><base href="https://example.com/">' +
      '<a href="javascript:window.ran = true">link</a><iframe src="/"></iframe><form action="/api"><button>Go</button></form>' +
      '<style>body { display: none; }</style><p style="display: none">still text</p><link rel="stylesheet" href="/x.css">';
    localStorage.setItem(
      KEPT_VIEW_KEY,
      JSON.stringify({ v: 1, userId: 7, farmId: 3, at: new Date().toISOString(), css: [], html: hostile }),
    );
    freshPage();
    runScript();
    const copy = document.querySelector(`#${KEPT_VIEW_ID} .kept-view-copy`)!;
    expect(copy.querySelectorAll('script, meta, base, iframe, form, style, link')).toHaveLength(0);
    expect(copy.querySelector('img')!.hasAttribute('onerror')).toBe(false);
    expect(copy.querySelector('a')!.hasAttribute('href')).toBe(false);
    expect(copy.querySelector('p')!.hasAttribute('style')).toBe(false);
    expect(copy.textContent).toContain('still text');
    expect((window as unknown as { ran?: boolean }).ran).toBeUndefined();
  });
});
