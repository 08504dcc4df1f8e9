import { NAV_ITEMS, type NavItem, navItemsFor } from './nav-items';

const labels = (items: NavItem[]) => items.map((item) => item.label);

describe('navItemsFor', () => {
  it('when the owner signs in, then Home and Members show (the screens that exist so far)', () => {
    expect(labels(navItemsFor('owner'))).toEqual(['Home', 'Members']);
  });

  it('when an operator signs in, then Members does not show', () => {
    expect(labels(navItemsFor('operator'))).toEqual(['Home']);
  });

  it('when a viewer signs in, then Members does not show', () => {
    expect(labels(navItemsFor('viewer'))).toEqual(['Home']);
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
      ['Crew', 'Fields', 'Fleet', 'Home', 'Members', 'Pass plan', 'Run sheet', 'Season', 'Work board'].sort(),
    );
    expect(new Set(NAV_ITEMS.map((item) => item.path)).size).toBe(NAV_ITEMS.length);
  });

  it('then only Home and Members are switched on until their screens land', () => {
    expect(NAV_ITEMS.filter((item) => item.ready).map((item) => item.path)).toEqual(['/home', '/members']);
  });
});
