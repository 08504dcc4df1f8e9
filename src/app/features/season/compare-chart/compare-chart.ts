import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ChartConfiguration } from 'chart.js';
import { BaseChartDirective } from 'ng2-charts';
import { CHART } from '../chart-colours';
import type { Table } from '../season-shaping';

/** Area finished per operation in two seasons, bars side by side (rows of the compare table). */
@Component({
  selector: 'app-compare-chart',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [BaseChartDirective],
  template: `<div class="frame">
    <canvas baseChart type="bar" [data]="data()" [options]="options" role="img" [attr.aria-label]="description()"></canvas>
  </div>`,
  styles: `
    .frame {
      position: relative;
      height: 15rem;
    }
  `,
})
export class CompareChart {
  readonly table = input.required<Table>();
  readonly years = input.required<[number, number]>();
  readonly unit = input.required<string>();

  protected readonly description = computed(() => {
    const [a, b] = this.years();
    return `Area finished per operation, ${a} beside ${b}; the numbers are in the table below.`;
  });

  protected readonly data = computed<ChartConfiguration<'bar'>['data']>(() => {
    const [a, b] = this.years();
    const rows = this.table().rows;
    return {
      labels: rows.map((r) => String(r['operation'])),
      datasets: [
        { label: `${a} (${this.unit()})`, data: rows.map((r) => Number(r['areaA'] ?? 0)), backgroundColor: CHART.slate },
        { label: `${b} (${this.unit()})`, data: rows.map((r) => Number(r['areaB'] ?? 0)), backgroundColor: CHART.wheat },
      ],
    };
  });

  protected readonly options: ChartConfiguration<'bar'>['options'] = {
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    color: CHART.ink,
    plugins: { legend: { position: 'bottom', labels: { boxWidth: 12, color: CHART.ink } } },
    scales: {
      x: { ticks: { color: CHART.ink }, grid: { display: false } },
      y: { beginAtZero: true, ticks: { color: CHART.ink }, grid: { color: CHART.grid } },
    },
  };
}
