import type { Role } from '@shared/schemas/auth';

/** One entry of the main navigation. `icon` is a Material Symbols ligature name. */
export interface NavItem {
  path: string;
  label: string;
  icon: string;
  roles: readonly Role[];
  /**
   * False until the screen's route exists: the shell never links to a screen that is not there.
   * A feature switches its entry on in the same change that adds its route to app.routes.ts.
   */
  ready: boolean;
}

/** The whole main navigation, in display order. The server still enforces every permission. */
export const NAV_ITEMS: readonly NavItem[] = [
  { path: '/home', label: 'Home', icon: 'home', roles: ['owner', 'operator', 'viewer'], ready: true },
  { path: '/board', label: 'Work board', icon: 'view_kanban', roles: ['owner'], ready: true },
  { path: '/run-sheet', label: 'Run sheet', icon: 'checklist', roles: ['owner', 'operator'], ready: true },
  { path: '/fields', label: 'Fields', icon: 'landscape', roles: ['owner', 'operator', 'viewer'], ready: true },
  { path: '/pass-plan', label: 'Pass plan', icon: 'route', roles: ['owner', 'operator'], ready: true },
  { path: '/fleet', label: 'Fleet', icon: 'agriculture', roles: ['owner', 'operator', 'viewer'], ready: true },
  { path: '/crew', label: 'Crew', icon: 'badge', roles: ['owner'], ready: true },
  { path: '/season', label: 'Season', icon: 'bar_chart', roles: ['owner', 'viewer'], ready: true },
  { path: '/custom-work', label: 'Custom work', icon: 'handshake', roles: ['owner', 'viewer'], ready: true },
  { path: '/invoices', label: 'Invoices', icon: 'receipt_long', roles: ['owner', 'viewer'], ready: true },
  { path: '/members', label: 'Members', icon: 'manage_accounts', roles: ['owner'], ready: true },
];

/** The entries a role may use, of screens that exist. */
export function navItemsFor(role: Role | null, items: readonly NavItem[] = NAV_ITEMS): NavItem[] {
  if (role === null) return [];
  return items.filter((item) => item.ready && item.roles.includes(role));
}
