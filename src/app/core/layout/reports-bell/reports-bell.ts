import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { FieldReportsStore } from '../field-reports';

/** The count of open reports from the field, on the shell's bar on every page; opens the list. */
@Component({
  selector: 'app-reports-bell',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule, RouterLink],
  template: `
    <a class="bell" routerLink="/reports" [attr.aria-label]="label()" [class.has-open]="count() > 0">
      <mat-icon aria-hidden="true">{{ count() > 0 ? 'notification_important' : 'notifications_none' }}</mat-icon>
      @if (count() > 0) {
        <span class="count" aria-hidden="true" data-testid="reports-count">{{ count() }}</span>
      }
    </a>
  `,
  styles: `
    .bell {
      position: relative;
      display: inline-flex;
      align-items: center;
      justify-content: center;
      width: 48px;
      height: 48px;
      border-radius: 50%;
      color: inherit;
    }
    .bell:focus-visible {
      outline: 2px solid var(--furlong-bar-wheat, currentColor);
    }
    .count {
      position: absolute;
      top: 4px;
      right: 2px;
      min-width: 1.25rem;
      height: 1.25rem;
      padding: 0 0.3rem;
      box-sizing: border-box;
      border-radius: 0.625rem;
      background: var(--mat-sys-error);
      color: var(--mat-sys-on-error);
      font: var(--mat-sys-label-small);
      font-weight: 700;
      line-height: 1.25rem;
      text-align: center;
    }
  `,
})
export class ReportsBell {
  private readonly store = inject(FieldReportsStore);
  protected readonly count = this.store.count;
  protected readonly label = computed(() => {
    const n = this.count();
    return n === 0 ? 'Reports from the field: none open' : `Reports from the field: ${n} open`;
  });
}
