import { httpResource } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  DOCUMENT,
  DestroyRef,
  Injector,
  afterNextRender,
  computed,
  effect,
  inject,
  input,
  linkedSignal,
  signal,
  untracked,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatExpansionModule } from '@angular/material/expansion';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatOption } from '@angular/material/core';
import { MatSelect } from '@angular/material/select';
import { Router } from '@angular/router';
import { daySpan, farmTime } from '@shared/farm-time';
import { OPERATION_INFO } from '@shared/operations';
import { STATE_LABELS } from '@shared/schemas/terms';
import type { Me } from '@shared/schemas/auth';
import type { RunSheet, RunSheetItem } from '@shared/schemas/run-sheet';
import type { CrewMember } from '@shared/schemas/fleet';
import { messageOf } from '../../../core/http/api-error';
import { addDays, dateOf, isIsoDay, longDay, today } from '../../board/board-day';
import { RunSheetJob } from '../run-sheet-job/run-sheet-job';
import { JobCoverageMap } from '../../../shared/map/job-coverage/job-coverage';
import { runSheetUrl } from '../run-sheet-api';
import { OutboxStore } from '../outbox-store';
import { AuthStore, SERVER_WAIT_MS } from '../../../core/auth/auth-store';
import { API } from '../../../core/http/api-paths';
import { closeKeptView, keepView } from '../../../core/offline/kept-view';

const SHORT = new Intl.DateTimeFormat('en-US', { weekday: 'long', month: 'long', day: 'numeric' });
/** "Thursday, April 16": a day of the coming weeks, said the way a person says it. */
export const shortDay = (day: string): string => SHORT.format(dateOf(day));

/** How long after the server's day is drawn the page is kept as drawn (core/offline/kept-view). */
export const KEEP_VIEW_AFTER_MS = 1000;

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
 * The owner can open anyone's (`?person=`), to log for someone who phoned the work in. Each sheet
 * the network gives is kept on the device; with no answer the kept copy shows, "as of" its time.
 * The outbox's state shows on top, and a job with actions not yet sent is marked.
 */
@Component({
  selector: 'app-run-sheet-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    MatButtonModule,
    MatExpansionModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelect,
    MatOption,
    RunSheetJob,
    JobCoverageMap,
  ],
  templateUrl: './run-sheet-page.html',
  styleUrl: './run-sheet-page.scss',
})
export class RunSheetPage {
  private readonly router = inject(Router);
  private readonly auth = inject(AuthStore);
  protected readonly outbox = inject(OutboxStore);

  /** `?date=YYYY-MM-DD` from the address. */
  readonly date = input<string | undefined>();

  /** The day in the address, if any; without one the server opens the person's next day with work. */
  private readonly asked = computed(() => {
    const asked = this.date();
    return isIsoDay(asked) ? asked : null;
  });
  protected readonly day = computed(() => this.asked() ?? this.shown()?.date ?? today(this.auth.farm()?.timeZone));
  protected readonly dayLabel = computed(() => longDay(this.day()));

  /** `?person=<membership id>` (owner only): whose run sheet; the signed-in person's own when absent. */
  readonly person = input<string | undefined>();

  protected readonly isOwner = this.auth.isOwner;
  protected readonly personId = computed(() => {
    const id = Number(this.person());
    return this.auth.isOwner() && Number.isInteger(id) && id > 0 && id !== this.auth.me()?.membershipId ? id : null;
  });
  /** The sheet's address: a day (or the day the server picks) of a person. */
  private readonly address = computed(() => runSheetUrl(this.asked(), this.personId()));
  /**
   * Grows each time the day must be read again (the outbox's answers, the connection back). A new
   * read replaces one still on its way: that one may have left before the server applied what the
   * outbox sent, and `reload()` would be ignored while it runs, leaving its older answer on screen.
   */
  private readonly readAgain = signal(0);
  protected readonly sheet = httpResource<RunSheet>(() => {
    this.readAgain();
    return this.address();
  });
  /** The copy kept on this device for the address, read when the network gives no sheet. */
  private readonly kept = signal<{ address: string; sheet: RunSheet; savedAt: string } | null>(null);
  /** True once the device was asked for its copy of the address (whether it had one or not). */
  private readonly keptLooked = signal(false);
  /**
   * True once a read has gone SERVER_WAIT_MS without an answer: a weak signal can hold it for
   * minutes without failing it, so the kept copy shows meanwhile (the answer replaces it).
   */
  private readonly slow = signal(false);
  /**
   * The sheet shown: the network's, else the device's copy of the same address. While the same
   * address is read again, what was shown stays (no blank page between the two answers).
   */
  protected readonly shown = linkedSignal<
    { address: string; network: RunSheet | null; error: boolean; loading: boolean; slow: boolean; kept: RunSheet | null },
    RunSheet | null
  >({
    source: () => {
      const address = this.address();
      const kept = this.kept();
      return {
        address,
        network: this.sheet.hasValue() ? (this.sheet.value() ?? null) : null,
        error: this.sheet.error() !== undefined,
        loading: this.sheet.isLoading(),
        slow: this.slow(),
        kept: kept?.address === address ? kept.sheet : null,
      };
    },
    computation: (now, before) => {
      if (now.network) return now.network;
      if (now.error) return now.kept;
      const stays = now.loading && before?.source.address === now.address ? before.value : null;
      return stays ?? (now.loading && now.slow ? now.kept : null);
    },
  });
  /**
   * When the sheet shown is the device's copy: why ("No connection", or the server is slow to
   * answer) and "as of 06:12" (the farm's clock).
   */
  protected readonly asOf = computed(() => {
    const kept = this.kept();
    if (!kept || this.shown() !== kept.sheet) return null;
    return {
      why: this.sheet.error() === undefined ? 'Waiting for the server' : 'No connection',
      at: `as of ${farmTime(kept.savedAt, this.auth.farm()?.timeZone, 'clock')}`,
    };
  });
  /** Why this day shows when the person did not ask for one: "No work today; showing Thursday, April 16, the next day with work". */
  protected readonly openedNote = computed(() => {
    const s = this.shown();
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
    const s = this.shown();
    return s?.person.name ?? this.people().find((p) => p.membershipId === this.personId())?.name ?? null;
  });
  protected readonly items = computed(() =>
    [...(this.shown()?.assignments ?? [])].sort((a, b) => a.startTime.localeCompare(b.startTime) || a.order - b.order || a.id - b.id),
  );
  protected readonly loadError = computed(() => {
    const error = this.sheet.error();
    return error && !this.shown() ? messageOf(error) : null;
  });

  constructor() {
    // Whatever the network gives is kept on the device for the next time there is none.
    // The person's own sheet opened without a day (the one the navigation opens): the days after
    // it are read and kept as well.
    effect(() => {
      const value = this.sheet.hasValue() && !this.sheet.isLoading() ? this.sheet.value() : null;
      const address = this.address();
      const ownDefault = this.asked() === null && this.personId() === null;
      if (value)
        untracked(() => void this.outbox.keepSheet(address, value).then(() => (ownDefault ? this.outbox.keepAhead(value) : undefined)));
    });
    // A read with no answer yet after SERVER_WAIT_MS is slow. Once the app has opened from the
    // device (the server did not say who this is in time), the server is known to be slow: no
    // second wait.
    effect((onCleanup) => {
      if (!this.sheet.isLoading()) return untracked(() => this.slow.set(false));
      const wait = this.auth.fromDevice() ? 0 : SERVER_WAIT_MS;
      const timer = setTimeout(() => this.slow.set(true), wait);
      onCleanup(() => clearTimeout(timer));
    });
    // No answer (or none yet after the wait): the device's copy of the same address, if it has one.
    effect(() => {
      const failed = this.sheet.error() !== undefined || (this.slow() && this.sheet.isLoading());
      const address = this.address();
      if (failed)
        untracked(
          () =>
            void this.outbox.keptSheet(address).then((k) => {
              if (k && this.address() === address) this.kept.set({ address, ...k });
              this.keptLooked.set(true);
            }),
        );
    });
    // The server answered actions from the outbox: read the day again (once per run of sends).
    let answered = this.outbox.answered();
    effect(() => {
      const now = this.outbox.answered();
      if (now !== answered) {
        answered = now;
        untracked(() => this.readAgain.update((n) => n + 1));
      }
    });
    this.closeCopyWhenShown();
    this.keepWhenDrawn();
    // The connection is back: the day may have changed meanwhile.
    const online = () => this.readAgain.update((n) => n + 1);
    window.addEventListener('online', online);
    inject(DestroyRef).onDestroy(() => window.removeEventListener('online', online));
  }
  /**
   * The copy the phone showed before the app started (core/offline/kept-view) goes in the render
   * where this page shows its day, or says it cannot (once the device was asked for its copy).
   */
  private closeCopyWhenShown(): void {
    const doc = inject(DOCUMENT);
    const injector = inject(Injector);
    let closed = false;
    effect(() => {
      const settled = this.shown() !== null || (this.loadError() !== null && this.keptLooked());
      if (settled && !closed) {
        closed = true;
        afterNextRender(() => closeKeptView(doc), { injector });
      }
    });
  }

  /**
   * Keeps the page as drawn for the next start with no connection (core/offline/kept-view): each
   * time the person's own day comes from the server, `KEEP_VIEW_AFTER_MS` after it is drawn (what
   * loads after the page, such as a map, has come in by then). Only then: a map moved, a panel
   * opened or a track recording do not copy the page again.
   */
  private keepWhenDrawn(): void {
    const doc = inject(DOCUMENT);
    const injector = inject(Injector);
    const root = doc.querySelector('app-root');
    if (!root) return;
    let timer: ReturnType<typeof setTimeout> | undefined;
    inject(DestroyRef).onDestroy(() => clearTimeout(timer));
    /** The person, when the page shows their own day as the server gave it (not the device's copy, not loading). */
    const keeping = (): Me | null => {
      const me = this.auth.me();
      const own = this.asked() === null && this.personId() === null;
      const fromServer = this.sheet.hasValue() && !this.sheet.isLoading() && this.shown() === this.sheet.value() && this.asOf() === null;
      return me && own && fromServer ? me : null;
    };
    effect(() => {
      if (!keeping()) return;
      untracked(() =>
        afterNextRender(
          () => {
            clearTimeout(timer);
            // Asked again when the time comes: the person may have opened another day meanwhile.
            timer = setTimeout(() => {
              const me = untracked(keeping);
              if (me) keepView(me, root, doc);
            }, KEEP_VIEW_AFTER_MS);
          },
          { injector },
        ),
      );
    });
  }

  private readonly chosen = signal<{ day: string; id: number | null } | null>(null);
  protected readonly openId = computed(() => {
    const chosen = this.chosen();
    return chosen && chosen.day === this.day() ? chosen.id : firstOpen(this.items());
  });

  protected readonly stateLabels = STATE_LABELS;

  protected span(item: RunSheetItem): string {
    return daySpan(item.startTime, item.endTime);
  }

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

  /** A day picked on the phone's own date picker (YYYY-MM-DD); a cleared or half-typed one is ignored. */
  protected picked(event: Event): void {
    const value = (event.target as HTMLInputElement).value;
    if (isIsoDay(value)) this.goTo(value);
  }
}
