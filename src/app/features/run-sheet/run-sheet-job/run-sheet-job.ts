import {
  ChangeDetectionStrategy,
  Component,
  type Type,
  afterRenderEffect,
  computed,
  inject,
  input,
  linkedSignal,
  output,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { OPERATION_INFO } from '@shared/operations';
import { type AssignmentEvent, type EventType, STATE_LABELS } from '@shared/schemas/jobs';
import type { RunSheetEvent, RunSheetItem } from '@shared/schemas/run-sheet';
import { HAZARD_LABELS, type HazardKind } from '@shared/schemas/fields';
import { AuthStore } from '../../../core/auth/auth-store';
import { ApiError } from '../../../core/http/api-error';
import { FieldMap } from '../../../shared/map/field-map/field-map';
import { HourlyWindow } from '../../../shared/weather/hourly-window/hourly-window';
import { HazardSymbol } from '../../../shared/map/hazard-symbol/hazard-symbol';
import type { HazardFeature, MapField } from '../../../shared/map/map-types';
import { AreaPipe } from '../../../shared/units/area-pipe';
import { LengthPipe } from '../../../shared/units/length-pipe';
import { Units } from '../../../shared/units/units';
import { clockTime, hoursText } from '../../board/board-day';
import { CallOffDialog } from '../call-off-dialog/call-off-dialog';
import { CautionsRead } from '../cautions-read';
import { FinishDialog } from '../finish-dialog/finish-dialog';
import { ACTION_ICONS, ACTION_LABELS, actionsFor, canReportProblem } from '../job-actions';
import { ProblemDialog } from '../problem-dialog/problem-dialog';
import { RunSheetApi } from '../run-sheet-api';
import { sendFailure } from '../send-failure';
import { type JobDialogData, StartDialog } from '../start-dialog/start-dialog';

const DIALOGS: Partial<Record<EventType, Type<unknown>>> = { start: StartDialog, finish: FinishDialog, 'call-off': CallOffDialog };

const EVENT_WORDS: Record<AssignmentEvent['type'], string> = {
  start: 'Started',
  pause: 'Paused',
  resume: 'Resumed',
  finish: 'Finished',
  'call-off': 'Called off',
  problem: 'Problem reported',
  'log-edited': 'Log corrected by the owner',
  'log-deleted': 'Log cleared by the owner',
};

/**
 * One job of the run sheet, opened: what to do with what, the field's hazards and the cautions,
 * the pass plan, big buttons to log it, and the log so far. Pause and resume send at once; the rest
 * ask first. The time sent is the tap's, so a slow connection does not shift the log.
 */
@Component({
  selector: 'app-run-sheet-job',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [AreaPipe, FieldMap, HazardSymbol, HourlyWindow, LengthPipe, MatButtonModule, MatIconModule],
  templateUrl: './run-sheet-job.html',
  styleUrl: './run-sheet-job.scss',
})
export class RunSheetJob {
  private readonly api = inject(RunSheetApi);
  private readonly dialog = inject(MatDialog);
  private readonly units = inject(Units);
  private readonly auth = inject(AuthStore);
  private readonly cautionsRead = inject(CautionsRead);

  readonly item = input.required<RunSheetItem>();
  readonly changed = output<RunSheetItem>();
  /** The job moved on elsewhere (a 409): the page should read the sheet again. */
  readonly outdated = output<void>();

  protected readonly operationLabel = computed(() => OPERATION_INFO[this.item().operation].label);
  protected readonly actions = computed(() => actionsFor(this.item()));
  protected readonly canReport = computed(() => canReportProblem(this.item().state));
  protected readonly stateLabel = computed(() => STATE_LABELS[this.item().state]);
  protected readonly planHours = computed(() => hoursText(this.item().planHours));
  protected readonly mapFields = computed<MapField[]>(() => [
    { id: this.item().field.id, name: this.item().field.name, boundary: this.item().field.boundary },
  ]);
  protected readonly hazards = computed(() => this.item().field.hazards.features as HazardFeature[]);
  protected readonly plan = computed(() => {
    const p = this.item().passPlan;
    if (!p) return null;
    const s = p.summary as Record<string, unknown>;
    const num = (k: string) => (typeof s[k] === 'number' ? (s[k] as number) : null);
    const heading = p.headingDeg ?? num('headingDeg');
    return {
      heading: heading == null ? '—' : `${Math.round(heading)}°`,
      passes: num('passCount'),
      turns: num('turns'),
      headland: p.headlandPasses,
      hours: num('hours'),
      widthM: p.widthM,
      speedMph: p.speedMph,
    };
  });
  protected readonly log = computed(() =>
    [...this.item().events]
      .sort((a, b) => a.at.localeCompare(b.at))
      .map((e) => ({ id: e.id, time: clockTime(e.at), text: eventText(e, (acres) => this.units.area(acres)) })),
  );

  /** Who reads, which day, which operation: the cautions are read once per person, day and operation on this device. */
  private readonly cautionsKey = computed(() => {
    const person = this.auth.me()?.membershipId;
    return person === undefined ? null : { person, day: this.item().date, operation: this.item().operation };
  });
  /** Open the first time of the day, folded after (still there, one tap away). */
  protected readonly cautionsFolded = linkedSignal(() => {
    const k = this.cautionsKey();
    return k !== null && this.cautionsRead.has(k.person, k.day, k.operation);
  });

  constructor() {
    // Shown open once: from now on this day they start folded. Marked after the render, so the
    // first showing is never folded by its own mark.
    afterRenderEffect(() => {
      const k = this.cautionsKey();
      if (k && !this.cautionsFolded()) this.cautionsRead.mark(k.person, k.day, k.operation);
    });
  }

  protected readonly labels = ACTION_LABELS;
  protected readonly clockSpan = clockSpan;
  protected readonly icons = ACTION_ICONS;
  protected readonly hoursText = hoursText;
  /** The action being sent, so its button (and the others) wait. */
  protected readonly sending = signal<EventType | null>(null);
  protected readonly failure = signal<{ message: string; retry: (() => void) | null } | null>(null);

  protected hazardLabel(kind: string): string {
    return HAZARD_LABELS[kind as HazardKind] ?? kind;
  }

  protected act(type: EventType): void {
    if (this.sending()) return;
    const at = new Date().toISOString();
    const dialog = DIALOGS[type];
    this.failure.set(null);
    if (dialog) {
      this.openDialog(dialog, at);
      return;
    }
    this.send(type, at);
  }

  protected report(): void {
    this.failure.set(null);
    this.openDialog(ProblemDialog, new Date().toISOString());
  }

  private openDialog(component: Type<unknown>, at: string): void {
    const data: JobDialogData = { item: this.item(), at };
    this.dialog
      .open<unknown, JobDialogData, RunSheetItem>(component, {
        data,
        width: '30rem',
        maxWidth: 'calc(100vw - 1rem)',
        autoFocus: 'first-tabbable',
      })
      .afterClosed()
      .subscribe((item) => {
        if (item) this.changed.emit(item);
      });
  }

  /** Pause and resume: one tap sends; a failure keeps the same tap time for the retry. */
  private send(type: EventType, at: string): void {
    this.sending.set(type);
    this.api.event(this.item().id, { type, at }).subscribe({
      next: (item) => {
        this.sending.set(null);
        this.changed.emit(item);
      },
      error: (err: unknown) => {
        this.sending.set(null);
        const conflict = err instanceof ApiError && err.status === 409;
        this.failure.set({
          message: sendFailure(err, this.labels[type]) ?? '',
          retry: conflict ? null : () => this.retry(type, at),
        });
        if (conflict) this.outdated.emit();
      },
    });
  }

  private retry(type: EventType, at: string): void {
    if (this.sending()) return;
    this.failure.set(null);
    this.send(type, at);
  }
}

/**
 * Clock time in hours and minutes ("3 h 30 min", "2 min"): kept apart from engine hours, which the
 * meter gives, so a job logged at the end of the day never reads as worked for 0 h.
 */
export function clockSpan(hours: number): string {
  const minutes = Math.round(hours * 60);
  if (minutes < 1) return 'under a minute';
  const h = Math.floor(minutes / 60);
  const m = minutes % 60;
  if (h === 0) return `${m} min`;
  return m === 0 ? `${h} h` : `${h} h ${m} min`;
}

/** One line of the job's log in plain words. */
export function eventText(e: RunSheetEvent, area: (acres: number) => string): string {
  const parts = [EVENT_WORDS[e.type] ?? e.type];
  if (e.type === 'problem' && e.reason) parts[0] = `Problem reported: ${e.reason === 'hazard' ? 'new hazard' : e.reason}`;
  if (e.type === 'call-off' && e.reason) parts.push(`(${e.reason})`);
  if (e.acres != null) parts.push(`· ${area(e.acres)}`);
  if (e.engineHours != null) parts.push(`· meter ${e.engineHours} h`);
  if (e.by) parts.push(`· ${e.by}`);
  let text = parts.join(' ');
  if (e.note) text = `${text}: “${e.note}”`;
  // A call-off for weather: the forecast hour and reason the server read when it was logged.
  if (e.weather) {
    const w = e.weather;
    const verdict = w.verdict ? ` ${w.verdict}` : '';
    text += ` — forecast for ${w.hour.slice(11, 16)}${verdict}${w.reason ? `: ${w.reason}` : ''}`;
  }
  return text;
}
