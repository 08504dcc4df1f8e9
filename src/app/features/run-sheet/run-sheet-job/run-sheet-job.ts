import {
  ChangeDetectionStrategy,
  Component,
  Injector,
  type Type,
  afterRenderEffect,
  computed,
  inject,
  input,
  linkedSignal,
  signal,
} from '@angular/core';
import { NgTemplateOutlet } from '@angular/common';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { daySpan, farmTime } from '@shared/farm-time';
import { formatEngineHours, formatPassHeading } from '@shared/figures';
import { OPERATION_INFO } from '@shared/operations';
import type { AssignmentEvent } from '@shared/schemas/jobs';
import { type EventType, STATE_LABELS } from '@shared/schemas/terms';
import type { RunSheetEvent, RunSheetItem } from '@shared/schemas/run-sheet';
import { HAZARD_LABELS, type HazardKind } from '@shared/schemas/terms';
import { AuthStore } from '../../../core/auth/auth-store';
import { messageOf } from '../../../core/http/api-error';
import { API } from '../../../core/http/api-paths';
import { FieldMap } from '../../../shared/map/field-map/field-map';
import { HourlyWindow } from '../../../shared/weather/hourly-window/hourly-window';
import { HazardSymbol } from '../../../shared/map/hazard-symbol/hazard-symbol';
import type { HazardFeature, MapField } from '../../../shared/map/map-types';
import { AreaPipe } from '../../../shared/units/area-pipe';
import { LengthPipe } from '../../../shared/units/length-pipe';
import { Units } from '../../../shared/units/units';
import { hoursText, shortDay, today } from '../../board/board-day';
import { CautionsRead } from '../cautions-read';
import type { OutboxEntry } from '../outbox/outbox';
import { ACTION_ICONS, ACTION_LABELS, type UnsentAction, actionsFor, canReportProblem, withUnsent } from '../job-actions';
import { OutboxStore } from '../outbox-store';
import { JobPosition } from '../job-position/job-position';
import { TrackRecorder } from '../track-recorder/track-recorder';
import type { JobDialogData } from '../start-dialog/start-dialog';

/**
 * The dialogs, loaded when first asked for: they are not needed to show the run sheet, so they stay
 * out of the code the page waits for (the service worker keeps them on the phone all the same).
 */
type DialogLoader = () => Promise<Type<unknown>>;
const DIALOGS: Partial<Record<EventType, DialogLoader>> = {
  start: () => import('../start-dialog/start-dialog').then((m) => m.StartDialog),
  finish: () => import('../finish-dialog/finish-dialog').then((m) => m.FinishDialog),
  'call-off': () => import('../call-off-dialog/call-off-dialog').then((m) => m.CallOffDialog),
};
const problemDialog: DialogLoader = () => import('../problem-dialog/problem-dialog').then((m) => m.ProblemDialog);

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
 * the pass plan, big buttons to log it, and the log so far. Pause and resume are written at once;
 * the rest ask first. Every action goes to the phone's outbox with the time of the tap and is sent
 * from there, so no signal never stops the work: the job shows what waits, marked as not sent yet,
 * and what the server said of an action it could not apply.
 */
@Component({
  selector: 'app-run-sheet-job',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    AreaPipe,
    FieldMap,
    NgTemplateOutlet,
    HazardSymbol,
    HourlyWindow,
    JobPosition,
    LengthPipe,
    MatButtonModule,
    MatIconModule,
    TrackRecorder,
  ],
  templateUrl: './run-sheet-job.html',
  styleUrl: './run-sheet-job.scss',
})
export class RunSheetJob {
  private readonly outbox = inject(OutboxStore);
  private readonly injector = inject(Injector);
  private readonly units = inject(Units);
  private readonly auth = inject(AuthStore);
  private readonly cautionsRead = inject(CautionsRead);

  readonly item = input.required<RunSheetItem>();

  /** This job's actions waiting on the device, in tap order. */
  private readonly waiting = computed(() => this.outbox.entries().filter((e) => e.jobId === this.item().id));
  protected readonly unsent = computed(() => this.waiting().map((e) => e.body as UnsentAction));
  /**
   * Actions seen waiting since this reading of the job (the item), in tap order: once sent they
   * leave the outbox before the day is read again, and until then they still shape what is shown.
   */
  private seenSince: { item: RunSheetItem | null; entries: OutboxEntry[] } = { item: null, entries: [] };
  private readonly sentNotRead = computed(() => {
    const item = this.item();
    const waiting = this.waiting();
    if (this.seenSince.item !== item) this.seenSince = { item, entries: [] };
    const seen = this.seenSince.entries;
    for (const e of waiting) if (!seen.some((s) => s.clientEventId === e.clientEventId)) seen.push(e);
    return seen.filter((s) => !waiting.some((e) => e.clientEventId === s.clientEventId)).map((s) => s.body as UnsentAction);
  });
  protected readonly unsentText = computed(() => {
    const n = this.unsent().length;
    return `${n === 1 ? '1 action' : `${n} actions`} on this phone, not sent yet: kept here and sent when there is a connection.`;
  });
  /** The job as it will be once what waits is sent (the server's answer replaces it). */
  protected readonly job = computed(() => withUnsent(this.item(), this.unsent(), this.sentNotRead()));
  /** What the server said of this job's last action it could not apply (it kept it as a log). */
  protected readonly outcome = computed(() => this.outbox.view()?.outcomes.get(this.item().id)?.message ?? null);

  protected readonly operationLabel = computed(() => OPERATION_INFO[this.item().operation].label);
  protected readonly span = computed(() => daySpan(this.item().startTime, this.item().endTime));
  protected readonly actions = computed(() => actionsFor(this.job()));
  protected readonly canReport = computed(() => canReportProblem(this.job().state));
  /**
   * A job for a later day at the farm (read on the evening before): Start waits for its day, as the
   * server does, since the job was planned for that day's weather and crew. "Sat, December 5".
   */
  protected readonly startsOn = computed(() => {
    const day = this.item().date;
    return this.actions().includes('start') && day > today(this.auth.farm()?.timeZone) ? shortDay(day) : null;
  });
  protected readonly stateLabel = computed(() => STATE_LABELS[this.job().state]);
  /** The job's operator and the owner may take its task data; a mentor rides along and does not. */
  protected readonly canTaskData = computed(() => this.item().role === 'operator' || this.auth.isOwner());
  protected readonly taskDataHref = computed(() => API.assignmentTaskData(this.item().id));
  protected readonly taskDataName = computed(() => `TASKDATA-${this.item().date}-job-${this.item().id}.zip`);
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
      heading: formatPassHeading(heading),
      passes: num('passCount'),
      turns: num('turns'),
      headland: p.headlandPasses,
      hours: num('hours'),
      widthM: p.widthM,
      speedMps: p.speedMps,
    };
  });
  protected readonly log = computed(() =>
    [...this.job().events]
      .sort((a, b) => a.at.localeCompare(b.at))
      .map((e) => ({
        id: e.id,
        time: farmTime(e.at, this.auth.farm()?.timeZone),
        text: eventText(e, (acres) => this.units.area(acres)),
        unsent: e.unsent === true,
      })),
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
  protected readonly meterText = formatEngineHours;
  /** The action being written to the device, so its button (and the others) wait. */
  protected readonly sending = signal<EventType | null>(null);
  protected readonly failure = signal<string | null>(null);

  protected hazardLabel(kind: string): string {
    return HAZARD_LABELS[kind as HazardKind] ?? kind;
  }

  protected act(type: EventType): void {
    if (this.sending() || (type === 'start' && this.startsOn())) return;
    const at = new Date().toISOString();
    const dialog = DIALOGS[type];
    this.failure.set(null);
    if (dialog) {
      this.openDialog(dialog, at);
      return;
    }
    this.write(type, at);
  }

  protected report(): void {
    this.failure.set(null);
    this.openDialog(problemDialog, new Date().toISOString());
  }

  private openDialog(load: DialogLoader, at: string): void {
    // The dialog service comes with the first dialog, out of the code the run sheet waits for.
    Promise.all([load(), import('@angular/material/dialog')]).then(
      ([component, { MatDialog }]) => {
        // The job as the operator sees it, unsent actions included: a finish after an offline start
        // starts from that start's meter reading.
        const data: JobDialogData = { item: this.job(), at };
        this.injector.get(MatDialog).open<unknown, JobDialogData>(component, {
          data,
          width: '30rem',
          maxWidth: 'calc(100vw - 1rem)',
          autoFocus: 'first-tabbable',
        });
      },
      (err: unknown) => this.failure.set(`The form could not be opened on this phone (${messageOf(err)}). Nothing was kept: tap again.`),
    );
  }

  /** Pause and resume: one tap writes it to the outbox with the tap time; sending follows. */
  private write(type: EventType, at: string): void {
    this.sending.set(type);
    this.outbox.tap(this.item().id, { type }, new Date(at)).then(
      () => this.sending.set(null),
      (err: unknown) => {
        this.sending.set(null);
        this.failure.set(`${messageOf(err)} Nothing was kept: tap ${this.labels[type]} again.`);
      },
    );
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
  if (e.engineHours != null) parts.push(`· meter ${formatEngineHours(e.engineHours)}`);
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
