import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { farmTime } from '@shared/farm-time';
import { OPERATION_INFO } from '@shared/operations';
import type { FieldReport } from '@shared/schemas/run-sheet';
import { AuthStore } from '../../../core/auth/auth-store';
import { messageOf } from '../../../core/http/api-error';
import { FieldReportsStore } from '../../../core/layout/field-reports';

const KIND: Record<FieldReport['kind'], { label: string; icon: string }> = {
  breakdown: { label: 'Breakdown', icon: 'build' },
  hazard: { label: 'New hazard', icon: 'warning' },
  other: { label: 'Problem', icon: 'report' },
};

const DAY = new Intl.DateTimeFormat('en-US', { weekday: 'short', month: 'short', day: 'numeric', timeZone: 'UTC' });

/**
 * The open reports from the field, newest first: what, where (links to the job's board day and the
 * field), who and when, with Confirm and Dismiss. Machines a breakdown put down are listed first.
 */
@Component({
  selector: 'app-reports-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, RouterLink],
  templateUrl: './reports-page.html',
  styleUrl: './reports-page.scss',
})
export class ReportsPage {
  protected readonly store = inject(FieldReportsStore);
  private readonly auth = inject(AuthStore);
  protected readonly busy = signal<number | null>(null);
  protected readonly failure = signal<string | null>(null);

  protected kind(r: FieldReport) {
    return KIND[r.kind];
  }

  protected operation(r: FieldReport): string {
    return OPERATION_INFO[r.job.operation].label.toLowerCase();
  }

  /** When a report came in, at the farm's clock: "Thu, May 15, 14:05". */
  protected when(iso: string): string {
    return farmTime(iso, this.auth.farm()?.timeZone, 'weekday');
  }

  protected day(date: string): string {
    return DAY.format(new Date(`${date}T00:00:00Z`));
  }

  protected review(r: FieldReport, action: 'confirm' | 'dismiss'): void {
    if (this.busy() !== null) return;
    this.busy.set(r.id);
    this.failure.set(null);
    this.store.review(r.id, action).subscribe({
      next: () => this.busy.set(null),
      error: (err: unknown) => {
        this.busy.set(null);
        this.failure.set(messageOf(err));
        this.store.refresh();
      },
    });
  }
}
