import { FIGURE_DECIMALS, figure } from '@shared/figures';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ChartConfiguration } from 'chart.js';
import { BaseChartDirective } from 'ng2-charts';
import { CHART } from '../chart-colours';
import { weekLabel, type WeekChart as WeekChartData } from '../season-shaping';

/** One operation over the weeks of the season: bars for each week's work, a line for the season to date. */
@Component({
  selector: 'app-week-chart',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [BaseChartDirective],
  templateUrl: './week-chart.html',
  styleUrl: './week-chart.scss',
})
export class WeekChart {
  readonly chart = input.required<WeekChartData>();
  /** 'ac' or 'ha'. */
  readonly unit = input.required<string>();

  /** What the chart shows, in words, for screen readers (the canvas itself is a picture). */
  protected readonly description = computed(() => {
    const c = this.chart();
    const busiest = c.busiestWeek ? `; the busiest week began ${weekLabel(c.busiestWeek)}` : '';
    return `${c.label}: ${figure(c.total, FIGURE_DECIMALS.area)} ${this.unit()} over ${c.weeks.length} weeks from ${weekLabel(c.weeks[0])}${busiest}.`;
  });

  protected readonly data = computed(() => {
    const c = this.chart();
    const u = this.unit();
    return {
      labels: c.weeks.map(weekLabel),
      datasets: [
        { type: 'bar', label: `That week (${u})`, data: c.weekly, backgroundColor: CHART.wheat, yAxisID: 'y', order: 2 },
        {
          type: 'line',
          label: `Season to date (${u})`,
          data: c.cumulative,
          borderColor: CHART.slate,
          backgroundColor: CHART.slate,
          yAxisID: 'y1',
          pointRadius: 2,
          tension: 0.2,
          order: 1,
        },
      ],
    } as unknown as ChartConfiguration<'bar'>['data'];
  });

  protected readonly options = computed<ChartConfiguration<'bar'>['options']>(() => ({
    responsive: true,
    maintainAspectRatio: false,
    animation: false,
    color: CHART.ink,
    plugins: { legend: { position: 'bottom', labels: { boxWidth: 12, color: CHART.ink } } },
    scales: {
      x: { ticks: { color: CHART.ink, maxRotation: 0, autoSkipPadding: 8 }, grid: { display: false } },
      y: {
        beginAtZero: true,
        ticks: { color: CHART.ink },
        grid: { color: CHART.grid },
        title: { display: true, text: `per week (${this.unit()})`, color: CHART.ink },
      },
      y1: {
        beginAtZero: true,
        position: 'right',
        ticks: { color: CHART.ink },
        grid: { drawOnChartArea: false },
        title: { display: true, text: `to date (${this.unit()})`, color: CHART.ink },
      },
    },
  }));
}
