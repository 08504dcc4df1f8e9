import type { Role } from '@shared/schemas/auth';

export const ROLE_OPTIONS: readonly { value: Role; label: string; hint: string }[] = [
  { value: 'owner', label: 'Owner', hint: 'plans fields, fleet, crew and the work board' },
  { value: 'operator', label: 'Operator', hint: 'works the run sheet and reports' },
  { value: 'viewer', label: 'Viewer', hint: 'reads the season' },
];
