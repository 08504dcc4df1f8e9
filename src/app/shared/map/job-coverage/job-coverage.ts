import { HttpClient, httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input, linkedSignal, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { formatLatLon } from '@shared/figures';
import type { JobCoverage, JobCoverageView } from '@shared/schemas/track-coverage';
import { firstValueFrom } from 'rxjs';
import { API } from '../../../core/http/api-paths';
import { messageOf } from '../../../core/http/api-error';
import { AreaPipe } from '../../units/area-pipe';
import { Units } from '../../units/units';
import { PLANNED_PASS_COLOUR, coverageKey, coverageLayers, plannedPassLayers } from '../coverage-layers';
import { FieldMap } from '../field-map/field-map';
import type { HazardFeature, MapField } from '../map-types';

/**
 * What a job's track really covered, on the job's map: the covered ground, the ground worked
 * twice and the skips (with a key and their acres), and for the owner and the job's operator a
 * button to send a track file (GPX, GeoJSON, or an ISO 11783-10 TASKDATA.zip with a TimeLog).
 * Shows only the field until a track is measured.
 */
@Component({
  selector: 'app-job-coverage',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [AreaPipe, FieldMap, MatButtonModule, MatIconModule, MatProgressBarModule],
  templateUrl: './job-coverage.html',
  styleUrl: './job-coverage.scss',
})
export class JobCoverageMap {
  readonly assignmentId = input.required<number>();
  /** Whether the signed-in person may send a track (the owner, the job's operator). */
  readonly canSend = input(true);
  /**
   * Read and draw the coverage at once; otherwise only when asked (a run sheet lists many jobs,
   * and a day's coverage outlines are not small on a phone's connection).
   */
  readonly open = input(false);

  private readonly http = inject(HttpClient);
  private readonly units = inject(Units);

  protected readonly shown = linkedSignal(() => this.open());
  protected readonly view = httpResource<JobCoverageView>(() => (this.shown() ? API.assignmentCoverage(this.assignmentId()) : undefined));
  /** A measure just sent, shown before the view reloads. */
  private readonly sent = signal<JobCoverage | null>(null);
  protected readonly sending = signal(false);
  protected readonly error = signal<string | null>(null);

  protected readonly data = computed(() => (this.view.hasValue() ? this.view.value() : null));
  protected readonly coverage = computed(() => this.sent() ?? this.data()?.coverage ?? null);
  protected readonly fields = computed((): MapField[] => {
    const d = this.data();
    return d ? [{ id: d.field.id, name: d.field.name, boundary: d.field.boundary }] : [];
  });
  protected readonly hazards = computed(() => (this.data()?.field.hazards.features ?? []) as HazardFeature[]);
  protected readonly layers = computed(() => {
    const c = this.coverage();
    // The plan's passes first, under the coverage: where the work was meant to go.
    return [
      ...plannedPassLayers(this.data()?.passes ?? null),
      ...(c
        ? coverageLayers(c, (acres) => `Skipped: ${this.units.area(acres)} in ${c.skipCount} ${c.skipCount === 1 ? 'skip' : 'skips'}`)
        : []),
    ];
  });
  protected readonly hasPasses = computed(() => (this.data()?.passes?.features.length ?? 0) > 0);
  protected readonly passColour = PLANNED_PASS_COLOUR;
  protected readonly key = computed(() => {
    const c = this.coverage();
    return c ? coverageKey(c) : [];
  });
  /** Skips are flagged one by one where the operation must cover everything (seeding, spraying). */
  /** A skip's centre as every position reads ([lon, lat] in, "47.61234° N, 99.91234° W" out). */
  protected readonly position = (p: readonly number[]): string => formatLatLon(p[0], p[1]);
  protected readonly flagSkips = computed(() => this.data()?.job.coverageRule === 'full' && (this.coverage()?.skipCount ?? 0) > 0);
  protected readonly loadError = computed(() => (this.view.error() ? messageOf(this.view.error()) : null));

  protected async send(input: HTMLInputElement): Promise<void> {
    const file = input.files?.[0];
    input.value = '';
    if (!file) return;
    const form = new FormData();
    form.append('file', file, file.name);
    await this.measure(API.assignmentCoverage(this.assignmentId()), form);
  }

  /** Measures the track the run sheet recorded on the operator's phone (replacing a file's measure). */
  protected phoneTrack(): Promise<void> {
    return this.measure(API.assignmentPhoneTrackCoverage(this.assignmentId()), {});
  }

  private async measure(url: string, body: FormData | object): Promise<void> {
    this.sending.set(true);
    this.error.set(null);
    try {
      this.sent.set(await firstValueFrom(this.http.post<JobCoverage>(url, body)));
      if (this.shown()) this.view.reload();
      else this.shown.set(true);
    } catch (err) {
      this.error.set(messageOf(err));
    } finally {
      this.sending.set(false);
    }
  }
}
