import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { RouterLink } from '@angular/router';
import { formatAcres } from '@shared/figures';
import type { Customer } from '@shared/schemas/customers';
import type { RateCard } from '@shared/schemas/rate-card';
import { filter, switchMap } from 'rxjs';
import { AuthStore } from '../../../core/auth/auth-store';
import { API } from '../../../core/http/api-paths';
import { messageOf } from '../../../core/http/api-error';
import { ConfirmDialog, type ConfirmDialogData } from '../../../shared/ui/confirm-dialog/confirm-dialog';
import { CustomWorkApi } from '../custom-work-api';
import { CustomerForm, type CustomerFormData } from '../customer-form/customer-form';
import { RateRow } from '../rate-row/rate-row';

/**
 * Custom work done for neighbours: the customers with their fields, and the rate card each job is
 * invoiced at. The owner keeps both; viewers (the accountant) read them; operators never come here.
 */
@Component({
  selector: 'app-custom-work-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, RateRow, RouterLink],
  templateUrl: './custom-work-page.html',
  styleUrl: './custom-work-page.scss',
})
export class CustomWorkPage {
  private readonly api = inject(CustomWorkApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  protected readonly isOwner = inject(AuthStore).isOwner;
  protected readonly formatAcres = formatAcres;

  protected readonly customers = httpResource<Customer[]>(() => API.customers, { defaultValue: [] });
  protected readonly rateCard = httpResource<RateCard>(() => API.rateCard);
  protected readonly customerRows = computed(() =>
    this.customers.hasValue() ? [...this.customers.value()].sort((a, b) => a.name.localeCompare(b.name)) : [],
  );
  protected readonly rates = computed(() => (this.rateCard.hasValue() ? (this.rateCard.value()?.rates ?? []) : []));
  protected readonly customersError = computed(() => (this.customers.error() ? messageOf(this.customers.error()) : null));
  protected readonly ratesError = computed(() => (this.rateCard.error() ? messageOf(this.rateCard.error()) : null));

  protected editCustomer(customer: Customer | null): void {
    const data: CustomerFormData = { customer, customers: this.customerRows() };
    this.dialog
      .open<CustomerForm, CustomerFormData, Customer>(CustomerForm, { data, width: '36rem', maxWidth: '95vw' })
      .afterClosed()
      .pipe(filter((saved): saved is Customer => !!saved))
      .subscribe((saved) => {
        // A field moved from another customer leaves their list too: read them all again.
        this.customers.reload();
        this.tell(`${saved.name} is saved.`);
      });
  }

  protected removeCustomer(customer: Customer): void {
    const data: ConfirmDialogData = {
      title: `Remove ${customer.name}?`,
      message: 'Their fields become the farm’s own again; the jobs done on them stay. A customer with invoices cannot be removed.',
      confirm: 'Remove',
    };
    this.dialog
      .open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data, autoFocus: 'dialog' })
      .afterClosed()
      .pipe(
        filter((yes) => yes === true),
        switchMap(() => this.api.deleteCustomer(customer.id)),
      )
      .subscribe({
        next: () => {
          this.customers.reload();
          this.tell(`${customer.name} was removed.`);
        },
        error: (err: unknown) => this.tell(messageOf(err)),
      });
  }

  protected rateSaved(card: RateCard): void {
    this.rateCard.set(card);
    this.tell('Rate card saved.');
  }

  private tell(message: string): void {
    this.snackBar.open(message, 'Close', { duration: 6000 });
  }
}
