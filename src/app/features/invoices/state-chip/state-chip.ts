import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { InvoiceListItem } from '@shared/schemas/invoices';
import { stateLook } from '../invoice-states';

/** An invoice's state as a chip: its words and an icon, the colour only a help. */
@Component({
  selector: 'app-state-chip',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  template: `<span class="chip" [class]="'chip ' + look().tone" [attr.data-state]="invoice().state"
    ><mat-icon aria-hidden="true">{{ look().icon }}</mat-icon
    >{{ look().label }}</span
  >`,
  styleUrl: './state-chip.scss',
})
export class StateChip {
  readonly invoice = input.required<Pick<InvoiceListItem, 'state' | 'creditedBy'>>();
  protected readonly look = computed(() => stateLook(this.invoice()));
}
