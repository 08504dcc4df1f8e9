import { ChangeDetectionStrategy, Component, computed, effect, inject, input, untracked } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatSlideToggleModule, type MatSlideToggleChange } from '@angular/material/slide-toggle';
import { farmTime } from '@shared/farm-time';
import type { AssignmentState } from '@shared/schemas/jobs';
import type { RunSheetItem } from '@shared/schemas/run-sheet';
import { AuthStore } from '../../../core/auth/auth-store';
import { PhoneTrackStore } from './phone-track-store';

/**
 * "Record track" on a job of the run sheet, for its operator: off until they turn it on for this
 * job; then, while the job is underway, the phone records its positions and sends them to the
 * farm's own server, where the job's coverage is measured from them when it finishes.
 */
@Component({
  selector: 'app-track-recorder',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule, MatSlideToggleModule],
  templateUrl: './track-recorder.html',
  styleUrl: './track-recorder.scss',
})
export class TrackRecorder {
  private readonly store = inject(PhoneTrackStore);
  private readonly auth = inject(AuthStore);

  readonly item = input.required<RunSheetItem>();
  /** The job's state as the run sheet shows it (actions not yet sent included). */
  readonly state = input.required<AssignmentState>();

  protected readonly track = computed(() => this.store.jobs().get(this.item().id) ?? null);
  protected readonly on = computed(() => this.track()?.on ?? false);
  protected readonly underway = computed(() => this.state() === 'underway');
  /** The switch can be turned on only while the job is underway; off at any time. */
  protected readonly disabled = computed(() => !this.on() && !this.underway());
  protected readonly line = computed(() => {
    const t = this.track();
    const state = this.state();
    if (!t?.on) return state === 'underway' ? null : 'Can be turned on while the job is underway.';
    if (state === 'paused') return 'Paused: recording goes on when you resume the job.';
    if (state !== 'underway') return null;
    return t.recording ? 'Recording the track of this job.' : 'Starting…';
  });
  protected readonly counts = computed(() => {
    const t = this.track();
    if (!t || (!t.on && !t.unsent && !t.sent)) return null;
    const sent = t.lastSentAt ? `, last sent ${farmTime(t.lastSentAt, this.auth.farm()?.timeZone, 'clock')}` : '';
    return `${t.unsent} ${t.unsent === 1 ? 'point' : 'points'} on this phone waiting to be sent${sent}`;
  });

  constructor() {
    effect(() => {
      const id = this.item().id;
      const state = this.state();
      untracked(() => void this.store.follow(id, state));
    });
  }

  protected toggled(e: MatSlideToggleChange): void {
    void this.store.turn(this.item().id, e.checked, this.state());
  }
}
