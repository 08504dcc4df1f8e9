import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import { RouterLink } from '@angular/router';
import type { Role } from '@shared/schemas/auth';
import { AuthStore } from '../../core/auth/auth-store';
import { navItemsFor } from '../../core/layout/nav-items';

/** What each role does in Furlong, in one sentence. */
export const ROLE_PURPOSE: Record<Role, string> = {
  owner: 'As an owner you plan the farm: its fields, fleet and crew, the passes each field needs, and tomorrow’s work board.',
  operator: 'As an operator you see your run sheet for the day — field, implement, hazards and pass plan — and report what got done.',
  viewer: 'As a viewer you read the season: acres finished per operation, field and person, hours and progress across the farm.',
};

@Component({
  selector: 'app-home',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule, MatListModule, RouterLink],
  templateUrl: './home.html',
  styleUrl: './home.scss',
})
export class Home {
  private readonly auth = inject(AuthStore);

  protected readonly user = this.auth.user;
  protected readonly farm = this.auth.farm;
  protected readonly role = this.auth.role;
  protected readonly purpose = computed(() => {
    const role = this.role();
    return role ? ROLE_PURPOSE[role] : '';
  });
  /** The screens this role can open, other than Home itself. */
  protected readonly screens = computed(() => navItemsFor(this.role()).filter((item) => item.path !== '/home'));
}
