import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { provideNativeDateAdapter } from '@angular/material/core';
import { type MatDatepickerInputEvent, MatDatepickerModule } from '@angular/material/datepicker';
import { MatExpansionModule } from '@angular/material/expansion';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { Router } from '@angular/router';
import { OPERATION_INFO } from '@shared/operations';
import { STATE_LABELS } from '@shared/schemas/jobs';
import type { RunSheet, RunSheetItem } from '@shared/schemas/run-sheet';
import type { CrewMember } from '@shared/schemas/fleet';
import { messageOf } from '../../../core/http/api-error';
import { addDays, dateOf, isIsoDay, isoDay, longDay, today } from '../../board/board-day';
import { RunSheetJob } from '../run-sheet-job/run-sheet-job';
import { runSheetUrl } from '../run-sheet-api';
import { AuthStore } from '../../../core/auth/auth-store';
import { API } from '../../../core/http/api-paths';

const SHORT = new Intl.DateTimeFormat('en-US', { weekday: 'long', month: 'long', day: 'numeric' });
/** "Thursday, April 16": a day of the coming weeks, said the way a person says it. */
export const shortDay = (day: string): string => SHORT.format(dateOf(day));

const OPEN_FIRST: RunSheetItem['state'][] = ['underway', 'paused', 'planned'];

/** The job to open first: the person's own job that is going, else paused, else next; then one they mentor. */
export function firstOpen(items: readonly RunSheetItem[]): number | null {
  for (const role of ['operator', 'mentor'] as const) {
    for (const state of OPEN_FIRST) {
      const found = items.find((i) => i.role === role && i.state === state);
      if (found) return found.id;
    }
  }
  return null;
}

/**
 * The signed-in person's run sheet for a day (today unless `?date=` says otherwise): their jobs in
 * running order, each opening to its map, hazards, cautions, pass plan and the buttons to log it.
 * The owner can open anyone's (`?person=`), to log for someone who phoned the work in.
 */
@Component({
  selector: 'app-run-sheet-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    MatButtonModule,
    MatDatepickerModule,
    MatExpansionModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    RunSheetJob,
  ],
  providers: [provideNativeDateAdapter()],
  templateUrl: './run-sheet-page.html',
  styleUrl: './run-sheet-page.scss',
})
export class RunSheetPage {
  private readonly router = inject(Router);
  private readonly auth = inject(AuthStore);

  /** `?date=YYYY-MM-DD` from the address. */
  readonly date = input<string | undefined>();

  /** The day in the address, if any; without one the server opens the person's next day with work. */
  private readonly asked = computed(() => {
    const asked = this.date();
    return isIsoDay(asked) ? asked : null;
  });
  protected readonly day = computed(() => {
    const shown = this.sheet.hasValue() ? this.sheet.value()?.date : undefined;
    return this.asked() ?? shown ?? today(this.auth.farm()?.timeZone);
  });
  protected readonly dayDate = computed(() => dateOf(this.day()));
  protected readonly dayLabel = computed(() => longDay(this.day()));

  /** `?person=<membership id>` (owner only): whose run sheet; the signed-in person's own when absent. */
  readonly person = input<string | undefined>();

  protected readonly isOwner = this.auth.isOwner;
  protected readonly personId = computed(() => {
    const id = Number(this.person());
    return this.auth.isOwner() && Number.isInteger(id) && id > 0 && id !== this.auth.me()?.membershipId ? id : null;
  });
  protected readonly sheet = httpResource<RunSheet>(() => runSheetUrl(this.asked(), this.personId()));
  /** Why this day shows when the person did not ask for one: "No work today; showing Thursday, April 16, the next day with work". */
  protected readonly openedNote = computed(() => {
    const s = this.sheet.hasValue() ? this.sheet.value() : null;
    if (!s || this.sheet.isLoading()) return null;
    const whose = this.personId() === null ? '' : ` for ${s.person.name}`;
    if (s.opened === 'next-day-with-work') return `No work today${whose}; showing ${shortDay(s.date)}, the next day with work.`;
    if (s.opened === 'no-work-ahead') return `No work today${whose}, and none on the published days ahead.`;
    return null;
  });
  private readonly crew = httpResource<CrewMember[]>(() => (this.auth.isOwner() ? API.crew : undefined), { defaultValue: [] });
  /** The people the owner may open a run sheet for: everyone who can be given field work. */
  protected readonly people = computed(() =>
    this.crew.hasValue()
      ? this.crew
          .value()
          .filter((m) => m.role !== 'viewer')
          .sort((a, b) => a.name.localeCompare(b.name))
      : [],
  );
  protected readonly shownId = computed(() => this.personId() ?? this.auth.me()?.membershipId ?? null);
  /** The name of the person whose sheet the owner has open, when it is not their own. */
  protected readonly otherName = computed(() => {
    if (this.personId() === null) return null;
    const s = this.sheet.hasValue() ? this.sheet.value() : null;
    return s?.person.name ?? this.people().find((p) => p.membershipId === this.personId())?.name ?? null;
  });
  protected readonly items = computed(() =>
    this.sheet.hasValue() && this.sheet.value()
      ? [...this.sheet.value()!.assignments].sort((a, b) => a.startTime.localeCompare(b.startTime) || a.order - b.order || a.id - b.id)
      : [],
  );
  protected readonly loadError = computed(() => {
    const error = this.sheet.error();
    return error ? messageOf(error) : null;
  });
  private readonly chosen = signal<{ day: string; id: number | null } | null>(null);
  protected readonly openId = computed(() => {
    const chosen = this.chosen();
    return chosen && chosen.day === this.day() ? chosen.id : firstOpen(this.items());
  });

  protected readonly stateLabels = STATE_LABELS;

  protected operationLabel(item: RunSheetItem): string {
    return OPERATION_INFO[item.operation].label;
  }

  protected opened(id: number): void {
    this.chosen.set({ day: this.day(), id });
  }

  protected closed(id: number): void {
    if (this.openId() === id) this.chosen.set({ day: this.day(), id: null });
  }

  protected showPerson(id: number): void {
    const person = id === this.auth.me()?.membershipId ? null : id;
    void this.router.navigate([], { queryParams: { person }, queryParamsHandling: 'merge', replaceUrl: true });
  }

  protected goTo(day: string): void {
    void this.router.navigate([], { queryParams: { date: day }, queryParamsHandling: 'merge', replaceUrl: true });
  }

  protected step(days: number): void {
    this.goTo(addDays(this.day(), days));
  }

  protected picked(event: MatDatepickerInputEvent<Date>): void {
    if (event.value) this.goTo(isoDay(event.value));
  }

  protected replace(item: RunSheetItem): void {
    this.sheet.update((sheet) => (sheet ? { ...sheet, assignments: sheet.assignments.map((a) => (a.id === item.id ? item : a)) } : sheet));
  }
}
