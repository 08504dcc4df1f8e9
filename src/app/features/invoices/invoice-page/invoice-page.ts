import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { farmTime } from '@shared/farm-time';
import { billedQuantity } from '@shared/figures';
import { formatMoney } from '@shared/money';
import { OPERATION_INFO } from '@shared/operations';
import type { InvoiceDetail } from '@shared/schemas/invoices';
import { type Observable, filter } from 'rxjs';
import { AuthStore } from '../../../core/auth/auth-store';
import { API } from '../../../core/http/api-paths';
import { messageOf } from '../../../core/http/api-error';
import { ConfirmDialog, type ConfirmDialogData } from '../../../shared/ui/confirm-dialog/confirm-dialog';
import { invoiceActions } from '../invoice-states';
import { InvoicesApi } from '../invoices-api';
import { ReasonDialog, type ReasonDialogData } from '../reason-dialog/reason-dialog';
import { StateChip } from '../state-chip/state-chip';
import { percentText } from '../tax-settings/tax-rate';

type Line = InvoiceDetail['lines'][number];

const SOURCE_WORDS: Record<Line['quantitySource'], string> = {
  measured: 'measured from the track',
  typed: 'as logged',
  logged: 'hours logged',
};

/**
 * One invoice or credit note: its lines, tax line and total, its state in words, and the owner's
 * next steps (send, retry after a payment-service outage, void, credit note). A sent invoice is
 * never edited here: that is what a credit note is for.
 */
@Component({
  selector: 'app-invoice-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, RouterLink, StateChip],
  templateUrl: './invoice-page.html',
  styleUrl: './invoice-page.scss',
})
export class InvoicePage {
  private readonly api = inject(InvoicesApi);
  private readonly auth = inject(AuthStore);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);

  /** The route's `:id`. */
  readonly id = input.required<string>();
  protected readonly isOwner = this.auth.isOwner;
  protected readonly money = formatMoney;
  protected readonly invoice = httpResource<InvoiceDetail>(() => API.invoice(Number(this.id())));
  protected readonly inv = computed(() => (this.invoice.hasValue() ? (this.invoice.value() ?? null) : null));
  protected readonly loadError = computed(() => (this.invoice.error() ? messageOf(this.invoice.error()) : null));
  protected readonly actions = computed(() => {
    const inv = this.inv();
    return inv && this.isOwner() ? invoiceActions(inv) : null;
  });
  protected readonly pdfUrl = computed(() => API.invoicePdf(Number(this.id())));
  protected readonly busy = signal(false);
  /** What the last action did, in words (sent, voided …). */
  protected readonly outcome = signal<string | null>(null);
  /** Why the last action was refused, in words. */
  protected readonly failure = signal<string | null>(null);

  protected title(inv: InvoiceDetail): string {
    return `${inv.kind === 'credit' ? 'Credit note' : 'Invoice'} ${inv.number}`;
  }

  protected operation(line: Line): string {
    return OPERATION_INFO[line.operation].label;
  }

  protected quantity(line: Line): string {
    return billedQuantity(line.quantity, line.unit);
  }

  protected source(line: Line): string {
    return SOURCE_WORDS[line.quantitySource];
  }

  protected rate(line: Line): string {
    return `${formatMoney(line.rateCents)} per ${line.unit}`;
  }

  protected taxLabel(inv: InvoiceDetail): string {
    return `${inv.taxName ?? 'Tax'} (${percentText(inv.taxBasisPoints)} %)`;
  }

  protected when(at: string | null): string {
    return at ? farmTime(at, this.auth.farm()?.timeZone, 'stamp') : '—';
  }

  protected send(inv: InvoiceDetail, retry: boolean): void {
    const data: ConfirmDialogData = {
      title: retry ? `Try sending invoice ${inv.number} again?` : `Send invoice ${inv.number}?`,
      message: retry
        ? `A payment link is asked of the payment service again, then the invoice is mailed to ${inv.customerEmail}.`
        : `It is mailed to ${inv.customerEmail} with the PDF and a link to pay ${formatMoney(inv.totalCents)} online. Once sent it cannot be changed, only voided or credited.`,
      confirm: retry ? 'Retry' : 'Send',
    };
    this.dialog
      .open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data, autoFocus: 'dialog' })
      .afterClosed()
      .pipe(filter((yes) => yes === true))
      .subscribe(() => this.retry(inv));
  }

  /** Sends (again, after the payment service was out: the button beside its message). */
  protected retry(inv: InvoiceDetail): void {
    this.run(this.api.send(inv.id), (d) => (d.mailed ? `Invoice ${d.number} was sent to ${d.customerEmail}.` : null));
  }

  /**
   * Not named `void`: Angular's template syntax reads `void(inv)` as the `void` operator, which
   * evaluates its operand and calls nothing (the Void button did nothing under that name).
   */
  protected voidInvoice(inv: InvoiceDetail): void {
    this.withReason(
      {
        title: `Void invoice ${inv.number}?`,
        message: 'A void invoice keeps its number and is never paid; its payment link stops working. The work on it can be invoiced again.',
        confirm: 'Void invoice',
        act: (reason) => this.api.void(inv.id, reason),
      },
      (d) => {
        this.invoice.set(d);
        this.outcome.set(`Invoice ${d.number} is void.`);
      },
    );
  }

  protected credit(inv: InvoiceDetail): void {
    this.withReason(
      {
        title: `Credit invoice ${inv.number}?`,
        message:
          `A credit note for the whole of invoice ${inv.number} (${formatMoney(inv.totalCents)}) is made with the next number. The invoice itself is not changed. ` +
          (inv.mailed
            ? `The credit note is mailed to ${inv.customerEmail} with its PDF.`
            : 'The invoice was never mailed to the customer, so neither is the credit note.'),
        confirm: 'Make credit note',
        act: (reason) => this.api.credit(inv.id, reason),
      },
      (note) => void this.router.navigate(['/invoices', note.id]),
    );
  }

  private withReason(data: ReasonDialogData, done: (d: InvoiceDetail) => void): void {
    this.failure.set(null);
    this.outcome.set(null);
    this.dialog
      .open<ReasonDialog, ReasonDialogData, InvoiceDetail>(ReasonDialog, { data, width: '32rem', maxWidth: '95vw' })
      .afterClosed()
      .pipe(filter((d): d is InvoiceDetail => !!d))
      .subscribe(done);
  }

  /** Runs an action; the page shows the invoice as the server answered, and what happened. */
  private run(action: Observable<InvoiceDetail>, said: (d: InvoiceDetail) => string | null): void {
    this.busy.set(true);
    this.failure.set(null);
    this.outcome.set(null);
    action.subscribe({
      next: (d) => {
        this.busy.set(false);
        this.invoice.set(d);
        this.outcome.set(said(d));
      },
      error: (err: unknown) => {
        this.busy.set(false);
        this.failure.set(messageOf(err));
      },
    });
  }
}
