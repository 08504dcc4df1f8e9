import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { dayIn } from '@shared/calendar';
import { farmTime } from '@shared/farm-time';
import { formatMoney } from '@shared/money';
import type { Customer } from '@shared/schemas/customers';
import type { InvoiceDetail, InvoiceListItem, Receivables } from '@shared/schemas/invoices';
import { filter } from 'rxjs';
import { AuthStore } from '../../../core/auth/auth-store';
import { API } from '../../../core/http/api-paths';
import { messageOf } from '../../../core/http/api-error';
import { DraftInvoice, type DraftInvoiceData } from '../draft-invoice/draft-invoice';
import type { InvoicePayment } from '../invoice-payment';
import { StateChip } from '../state-chip/state-chip';
import { TaxSettings } from '../tax-settings/tax-settings';

/**
 * Invoices for custom work, what customers still owe and what they paid, each downloadable as CSV
 * for the accountant. The owner drafts invoices here; viewers read. Operators never come here.
 */
@Component({
  selector: 'app-invoices-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, RouterLink, StateChip, TaxSettings],
  templateUrl: './invoices-page.html',
  styleUrl: './invoices-page.scss',
})
export class InvoicesPage {
  private readonly auth = inject(AuthStore);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  protected readonly isOwner = this.auth.isOwner;
  protected readonly money = formatMoney;
  protected readonly csv = API.invoicesCsv;

  protected readonly invoices = httpResource<InvoiceListItem[]>(() => API.invoices, { defaultValue: [] });
  protected readonly receivables = httpResource<Receivables>(() => API.receivables);
  protected readonly payments = httpResource<InvoicePayment[]>(() => API.invoicePayments, { defaultValue: [] });
  /** Customers to draft for: the owner's only. */
  private readonly customers = httpResource<Customer[]>(() => (this.isOwner() ? API.customers : undefined), { defaultValue: [] });

  /** Newest number first. */
  protected readonly invoiceRows = computed(() =>
    this.invoices.hasValue() ? [...this.invoices.value()].sort((a, b) => b.number - a.number) : [],
  );
  protected readonly owed = computed(() => (this.receivables.hasValue() ? (this.receivables.value() ?? null) : null));
  protected readonly paymentRows = computed(() => (this.payments.hasValue() ? this.payments.value() : []));
  protected readonly loadError = computed(() => {
    const e = this.invoices.error() ?? this.receivables.error() ?? this.payments.error();
    return e ? messageOf(e) : null;
  });
  // Only the owner reads customers (to draft); for the viewer the empty default means "not read", not "none".
  protected readonly noCustomers = computed(() => this.isOwner() && this.customers.hasValue() && this.customers.value().length === 0);

  protected when(at: string | null): string {
    return at ? farmTime(at, this.auth.farm()?.timeZone, 'stamp') : '—';
  }

  protected reload(): void {
    this.invoices.reload();
    this.receivables.reload();
    this.payments.reload();
  }

  protected draft(): void {
    const data: DraftInvoiceData = {
      customers: this.customers.hasValue() ? [...this.customers.value()].sort((a, b) => a.name.localeCompare(b.name)) : [],
      today: dayIn(this.auth.farm()?.timeZone ?? 'UTC'),
    };
    this.dialog
      .open<DraftInvoice, DraftInvoiceData, InvoiceDetail>(DraftInvoice, { data, width: '34rem', maxWidth: '95vw' })
      .afterClosed()
      .pipe(filter((d): d is InvoiceDetail => !!d))
      .subscribe((d) => void this.router.navigate(['/invoices', d.id]));
  }
}
