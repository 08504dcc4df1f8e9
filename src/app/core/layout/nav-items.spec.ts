import { NAV_ITEMS, type NavItem, navItemsFor } from './nav-items';

const labels = (items: NavItem[]) => items.map((item) => item.label);

describe('navItemsFor', () => {
  it('when the owner signs in, then every screen shows', () => {
    expect(labels(navItemsFor('owner'))).toEqual([
      'Home',
      'Work board',
      'Run sheet',
      'Fields',
      'Pass plan',
      'Fleet',
      'Crew',
      'Season',
      'Custom work',
      'Invoices',
      'Members',
    ]);
  });

  it('when an operator signs in, then their run sheet and the read-only screens show, not the board or the season', () => {
    // Operators see no money: no custom work, no invoices.
    expect(labels(navItemsFor('operator'))).toEqual(['Home', 'Run sheet', 'Fields', 'Pass plan', 'Fleet']);
  });

  it('when a viewer signs in, then the season and the read-only screens show, not the board or run sheets', () => {
    expect(labels(navItemsFor('viewer'))).toEqual(['Home', 'Fields', 'Fleet', 'Season', 'Custom work', 'Invoices']);
  });

  it('when nobody is signed in, then nothing shows', () => {
    expect(navItemsFor(null)).toEqual([]);
  });

  it('when a screen is not ready, then no role sees it even if its role matches', () => {
    const items: NavItem[] = [
      { path: '/season', label: 'Season', icon: 'bar_chart', roles: ['owner', 'viewer'], ready: false },
      { path: '/run-sheet', label: 'Run sheet', icon: 'checklist', roles: ['operator'], ready: true },
    ];
    expect(labels(navItemsFor('viewer', items))).toEqual([]);
    expect(labels(navItemsFor('operator', items))).toEqual(['Run sheet']);
    expect(labels(navItemsFor('owner', items))).toEqual([]);
  });

  it('then every planned screen has an entry with a unique path', () => {
    expect(labels([...NAV_ITEMS]).sort()).toEqual(
      ['Crew', 'Custom work', 'Fields', 'Fleet', 'Home', 'Invoices', 'Members', 'Pass plan', 'Run sheet', 'Season', 'Work board'].sort(),
    );
    expect(new Set(NAV_ITEMS.map((item) => item.path)).size).toBe(NAV_ITEMS.length);
  });

  it('then every screen that exists is switched on, in the order of the day', () => {
    expect(NAV_ITEMS.filter((item) => item.ready).map((item) => item.path)).toEqual([
      '/home',
      '/board',
      '/run-sheet',
      '/fields',
      '/pass-plan',
      '/fleet',
      '/crew',
      '/season',
      '/custom-work',
      '/invoices',
      '/members',
    ]);
  });
});
