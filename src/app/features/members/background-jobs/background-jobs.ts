import { HttpClient, httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { failedJobList, type FailedJob } from '@shared/schemas/background';
import { farmTime } from '@shared/farm-time';
import { AuthStore } from '../../../core/auth/auth-store';
import { messageOf } from '../../../core/http/api-error';
import { API } from '../../../core/http/api-paths';

/**
 * The owner's list of e-mails (and, later, other background work) that failed for good after
 * every retry, with "Try again" for each. Mail still being retried is not listed: the board shows
 * a work order's delivery as it goes.
 */
@Component({
  selector: 'app-background-jobs',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatProgressBarModule],
  templateUrl: './background-jobs.html',
  styleUrl: './background-jobs.scss',
})
export class BackgroundJobs {
  private readonly http = inject(HttpClient);
  private readonly snackBar = inject(MatSnackBar);
  private readonly auth = inject(AuthStore);

  /** When a job gave up, at the farm's clock: "May 15, 14:05". */
  protected when(iso: string): string {
    return farmTime(iso, this.auth.farm()?.timeZone, 'stamp');
  }

  protected readonly failed = httpResource(() => API.backgroundFailed, { parse: (v) => failedJobList.parse(v) });
  protected readonly jobs = computed<FailedJob[]>(() => (this.failed.hasValue() ? this.failed.value().jobs : []));
  protected readonly loadError = computed(() => {
    const error = this.failed.error();
    return error ? messageOf(error) : null;
  });
  /** The job whose retry is on its way, so its button cannot be pressed twice. */
  protected readonly retrying = signal<string | null>(null);

  protected retry(job: FailedJob): void {
    this.retrying.set(job.id);
    this.http.post<void>(API.backgroundRetry(job.id), {}).subscribe({
      next: () => {
        this.retrying.set(null);
        this.snackBar.open(`${job.what}${job.to ? ` to ${job.to}` : ''} is queued again.`, 'OK', { duration: 5000 });
        this.failed.reload();
      },
      error: (err: unknown) => {
        this.retrying.set(null);
        this.snackBar.open(messageOf(err), 'OK', { duration: 8000 });
        this.failed.reload();
      },
    });
  }
}
