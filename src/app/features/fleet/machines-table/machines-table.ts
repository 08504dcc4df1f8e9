import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatTableModule } from '@angular/material/table';
import { formatEngineHours, formatPower } from '@shared/figures';
import { MACHINE_KIND_LABELS, type Machine } from '@shared/schemas/fleet';

/** Tractors and self-propelled machines with their meters and when each falls due for service. */
@Component({
  selector: 'app-machines-table',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule, MatTableModule],
  templateUrl: './machines-table.html',
  styleUrl: './machines-table.scss',
})
export class MachinesTable {
  readonly machines = input.required<readonly Machine[]>();
  /** Shows edit and delete in each row (the owner). */
  readonly editable = input(false);
  readonly loading = input(false);

  readonly edit = output<Machine>();
  readonly remove = output<Machine>();

  protected readonly columns = computed(() => [
    'name',
    'kind',
    'power',
    'engineHours',
    'interval',
    'service',
    ...(this.editable() ? ['actions'] : []),
  ]);

  protected readonly power = formatPower;
  protected readonly hours = formatEngineHours;

  protected kindLabel(m: Machine): string {
    return MACHINE_KIND_LABELS[m.kind] ?? m.kind;
  }

  /** `overdue`, `soon` (the server's warning without being overdue), or `ok`. */
  protected serviceState(m: Machine): 'overdue' | 'soon' | 'ok' | 'none' {
    if (m.serviceDueInHours === null) return 'none';
    if (m.serviceDueInHours < 0) return 'overdue';
    return m.serviceWarning ? 'soon' : 'ok';
  }
}
