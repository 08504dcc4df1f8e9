import { formatPower } from '@shared/figures';
import { ChangeDetectionStrategy, Component, computed, inject, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatTableModule } from '@angular/material/table';
import { OPERATION_INFO } from '@shared/operations';
import { IMPLEMENT_KIND_LABELS, type Implement, type Machine } from '@shared/schemas/fleet';
import { Units } from '../../../shared/units/units';
import { FOLDING_CAUTION, ROAD_CAUTION, folds, isWideOnRoad } from '../cautions';
import { type CautionLine, ImplementCautions } from '../implement-cautions/implement-cautions';
import { formatWidth } from '../widths';

interface ImplementRow {
  implement: Implement;
  kind: string;
  width: string;
  transportWidth: string;
  operations: string;
  pulledBy: string;
  wide: boolean;
  folds: boolean;
}

/** Implements with their widths in the farm's units, what they do and what may pull them. */
@Component({
  selector: 'app-implements-table',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ImplementCautions, MatButtonModule, MatIconModule, MatTableModule],
  templateUrl: './implements-table.html',
  styleUrl: './implements-table.scss',
})
export class ImplementsTable {
  private readonly units = inject(Units);

  readonly implements = input.required<readonly Implement[]>();
  readonly machines = input<readonly Machine[]>([]);
  readonly editable = input(false);
  readonly loading = input(false);

  readonly edit = output<Implement>();
  readonly remove = output<Implement>();

  protected readonly columns = computed(() => [
    'name',
    'kind',
    'width',
    'transportWidth',
    'operations',
    'pulledBy',
    ...(this.editable() ? ['actions'] : []),
  ]);

  protected readonly rows = computed<ImplementRow[]>(() => {
    const system = this.units.system();
    const names = new Map(this.machines().map((m) => [m.id, m.name]));
    return this.implements().map((i) => ({
      implement: i,
      kind: IMPLEMENT_KIND_LABELS[i.kind] ?? i.kind,
      width: formatWidth(i.widthM, system),
      transportWidth: formatWidth(i.transportWidthM, system),
      operations: i.operations.map((op) => OPERATION_INFO[op]?.label ?? op).join(', '),
      pulledBy: pulledBy(i, names),
      wide: isWideOnRoad(i),
      folds: folds(i),
    }));
  });

  protected readonly cautions = computed<CautionLine[]>(() => {
    const wide = this.rows()
      .filter((r) => r.wide)
      .map((r) => r.implement.name);
    const folding = this.rows()
      .filter((r) => r.folds)
      .map((r) => r.implement.name);
    return [
      ...(wide.length ? [{ text: ROAD_CAUTION, appliesTo: wide }] : []),
      ...(folding.length ? [{ text: FOLDING_CAUTION, appliesTo: folding }] : []),
    ];
  });
}

function pulledBy(i: Implement, names: Map<number, string>): string {
  if (i.machineIds.length) return i.machineIds.map((id) => names.get(id) ?? `machine ${id}`).join(', ');
  return i.minPowerHp !== null ? `Any tractor of ${formatPower(i.minPowerHp)} or more` : 'Any tractor';
}
