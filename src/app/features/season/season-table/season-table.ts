import { ChangeDetectionStrategy, Component, computed, effect, input, viewChild } from '@angular/core';
import { MatSort, MatSortModule } from '@angular/material/sort';
import { MatTableDataSource, MatTableModule } from '@angular/material/table';
import { formatCell, type Row, type Table } from '../season-shaping';

/** One table of the season report: sortable by any column, with its totals row at the foot. */
@Component({
  selector: 'app-season-table',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatSortModule, MatTableModule],
  templateUrl: './season-table.html',
  styleUrl: './season-table.scss',
})
export class SeasonTable {
  readonly table = input.required<Table>();
  /** Names the table for screen readers. */
  readonly label = input.required<string>();
  readonly empty = input('Nothing logged this season.');

  protected readonly keys = computed(() => this.table().columns.map((c) => c.key));
  protected readonly data = new MatTableDataSource<Row>([]);
  protected readonly cell = formatCell;
  private readonly sort = viewChild(MatSort);

  constructor() {
    // Empty cells sort below every number; text sorts without regard to case.
    this.data.sortingDataAccessor = (row, key) => {
      const v = row[key];
      return typeof v === 'string' ? v.toLowerCase() : (v ?? Number.NEGATIVE_INFINITY);
    };
    effect(() => (this.data.data = this.table().rows));
    effect(() => {
      const sort = this.sort();
      if (sort) this.data.sort = sort;
    });
  }
}
