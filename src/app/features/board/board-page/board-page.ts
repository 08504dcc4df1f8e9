import { type CdkDragDrop, DragDropModule } from '@angular/cdk/drag-drop';
import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { provideNativeDateAdapter } from '@angular/material/core';
import { type MatDatepickerInputEvent, MatDatepickerModule } from '@angular/material/datepicker';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { OPERATION_INFO } from '@shared/operations';
import type { Board, BoardAssignment, Conflict, PublishResult, WorkOrderState } from '@shared/schemas/board';
import type { FieldSummary } from '@shared/schemas/fields';
import type { CrewMember, Implement, Machine } from '@shared/schemas/fleet';
import { type Observable, filter, map } from 'rxjs';
import { messageOf } from '../../../core/http/api-error';
import { ConfirmDialog, type ConfirmDialogData } from '../../../shared/ui/confirm-dialog/confirm-dialog';
import { JobCoverageDialog, type JobCoverageDialogData } from '../../../shared/map/job-coverage-dialog/job-coverage-dialog';
import { AssignmentCard, type MoveTarget } from '../assignment-card/assignment-card';
import { AssignmentForm, type AssignmentFormData } from '../assignment-form/assignment-form';
import { BoardApi } from '../board-api';
import {
  type BoardColumn,
  type CardPlace,
  type OrderColumns,
  applyOrder,
  boardColumns,
  changesText,
  conflictsByCard,
  orderAfterMove,
} from '../board-columns';
import { addDays, dateOf, hoursText, isIsoDay, isoDay, longDay, shortDay, tomorrow } from '../board-day';
import { farmTime } from '@shared/farm-time';
import { DayStrip } from '../day-strip/day-strip';
import { describeChanges, staleBoardOf } from '../stale-board';
import { AuthStore } from '../../../core/auth/auth-store';
import { API } from '../../../core/http/api-paths';

/** A save the server refused because the board had moved on; `retry` re-applies it on the board now. */
interface StaleNotice {
  what: string;
  message: string;
  changes: string[];
  retry: (() => Observable<Board> | null) | null;
}

/**
 * The owner's work board for one day (tomorrow unless `?date=` says otherwise): a column of cards
 * per operator in running order, conflicts, and publishing the work orders.
 */
@Component({
  selector: 'app-board-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    RouterLink,
    AssignmentCard,
    DayStrip,
    DragDropModule,
    MatButtonModule,
    MatDatepickerModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
  ],
  providers: [provideNativeDateAdapter()],
  templateUrl: './board-page.html',
  styleUrl: './board-page.scss',
})
export class BoardPage {
  private readonly api = inject(BoardApi);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  private readonly auth = inject(AuthStore);

  /** `?date=YYYY-MM-DD` from the address. */
  readonly date = input<string | undefined>();

  protected readonly day = computed(() => {
    const asked = this.date();
    return isIsoDay(asked) ? asked : tomorrow(this.auth.farm()?.timeZone);
  });
  protected readonly dayDate = computed(() => dateOf(this.day()));
  protected readonly dayLabel = computed(() => longDay(this.day()));
  /** The day's task data: a plain link, so the browser downloads it with the session cookie. */
  protected readonly taskDataHref = computed(() => API.boardTaskData(this.day()));
  protected readonly taskDataName = computed(() => `TASKDATA-${this.day()}.zip`);

  protected readonly board = httpResource<Board>(() => API.board(this.day()));
  private readonly crew = httpResource<CrewMember[]>(() => API.crew, { defaultValue: [] });
  private readonly machines = httpResource<Machine[]>(() => API.machines, { defaultValue: [] });
  private readonly implementList = httpResource<Implement[]>(() => API.implements, { defaultValue: [] });
  private readonly fields = httpResource<FieldSummary[]>(() => API.fields, { defaultValue: [] });

  protected readonly current = computed(() => (this.board.hasValue() ? this.board.value() : null));
  protected readonly columns = computed(() => {
    const board = this.current();
    return board ? boardColumns(board, this.crew.hasValue() ? this.crew.value() : []) : [];
  });
  protected readonly conflictsOf = computed(() => {
    const board = this.current();
    return board ? conflictsByCard(board) : new Map<number, Board['conflicts']>();
  });
  protected readonly weatherOf = computed(() => new Map((this.current()?.weather.cards ?? []).map((w) => [w.assignmentId, w])));
  /** On an empty day (the off-season, most often), the first later day with cards, to jump to. */
  protected readonly nextDay = computed(() => {
    const b = this.current();
    if (!b || b.assignments.length > 0 || !b.nextDayWithWork) return null;
    return { day: b.nextDayWithWork, label: shortDay(b.nextDayWithWork) };
  });
  protected readonly hardConflicts = computed(() => this.current()?.conflicts.filter((c) => c.severity === 'hard') ?? []);
  protected readonly softConflicts = computed(() => this.current()?.conflicts.filter((c) => c.severity === 'soft') ?? []);
  protected readonly publishBlocked = computed(() => {
    const hard = this.hardConflicts().length;
    if (hard > 0) return `Publishing waits until ${hard === 1 ? 'the hard conflict is' : `the ${hard} hard conflicts are`} fixed.`;
    return null;
  });
  protected readonly loadError = computed(() => {
    const error = this.board.error() ?? this.crew.error() ?? this.machines.error() ?? this.implementList.error() ?? this.fields.error();
    return error ? messageOf(error) : null;
  });
  protected readonly listsReady = computed(
    () => this.crew.hasValue() && this.machines.hasValue() && this.implementList.hasValue() && this.fields.hasValue(),
  );

  protected readonly busy = signal(false);
  protected readonly problem = signal<string | null>(null);
  protected readonly notice = signal<string | null>(null);
  protected readonly stale = signal<StaleNotice | null>(null);

  protected readonly hoursText = hoursText;
  protected readonly changesText = changesText;
  /** An instant with its day at the farm's clock, whatever the browser's zone: "May 15, 14:05". */
  protected stamp(iso: string): string {
    return farmTime(iso, this.auth.farm()?.timeZone, 'stamp');
  }
  protected readonly limit = computed(() => this.current()?.dayHoursLimit ?? 0);

  protected goTo(day: string): void {
    this.stale.set(null);
    this.problem.set(null);
    this.notice.set(null);
    void this.router.navigate([], { queryParams: { date: day }, queryParamsHandling: 'merge', replaceUrl: true });
  }

  protected step(days: number): void {
    this.goTo(addDays(this.day(), days));
  }

  protected picked(event: MatDatepickerInputEvent<Date>): void {
    if (event.value) this.goTo(isoDay(event.value));
  }

  protected orderText(order: WorkOrderState | null, jobs: number): string {
    if (!order || order.status === 'none') return jobs ? 'Work order not sent' : 'No jobs, no work order';
    const what = order.kind === 'withdrawn' ? 'Withdrawal' : 'Work order';
    if (order.status === 'queued') return `${what} queued to send`;
    if (order.status === 'failed') return `${what} failed to send`;
    return `${what} sent${order.sentAt ? ` ${this.stamp(order.sentAt)}` : ''}`;
  }

  protected moveTargets(column: BoardColumn): MoveTarget[] {
    return this.columns()
      .filter((c) => c.membershipId !== column.membershipId)
      .map((c) => ({ membershipId: c.membershipId, name: c.name }));
  }

  protected titleOf(a: BoardAssignment): string {
    return `${a.field.name} ${OPERATION_INFO[a.operation].label.toLowerCase()}`;
  }

  protected openForm(options: { assignment?: BoardAssignment; operatorId?: number }): void {
    const board = this.current();
    if (!board || !this.listsReady()) return;
    const data: AssignmentFormData = {
      day: this.day(),
      version: board.version,
      ...options,
      fields: this.fields.value().map((f) => ({ id: f.id, name: f.name, acres: f.acres })),
      crew: this.crew.value(),
      machines: this.machines.value(),
      implements: this.implementList.value(),
      boardChanged: (next) => this.board.set(next),
    };
    this.stale.set(null);
    this.dialog
      .open<AssignmentForm, AssignmentFormData, Board>(AssignmentForm, {
        data,
        width: '44rem',
        maxWidth: 'calc(100vw - 1rem)',
        autoFocus: 'first-tabbable',
      })
      .afterClosed()
      .subscribe((saved) => {
        if (saved) this.notice.set(options.assignment ? 'Card saved.' : 'Card added.');
      });
  }

  /** A job's track and what it covered, on its map (the owner sends a track there). */
  protected openCoverage(a: BoardAssignment): void {
    this.dialog.open<JobCoverageDialog, JobCoverageDialogData>(JobCoverageDialog, {
      data: { assignmentId: a.id, title: this.titleOf(a) },
      width: '48rem',
      maxWidth: 'calc(100vw - 1rem)',
      autoFocus: 'dialog',
    });
  }

  protected remove(a: BoardAssignment): void {
    const data: ConfirmDialogData = {
      title: `Remove ${this.titleOf(a)}?`,
      message: `The card comes off ${a.operator.name}'s day. A published work order is marked as changed.`,
      confirm: 'Remove',
    };
    this.dialog
      .open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data, autoFocus: 'dialog' })
      .afterClosed()
      .pipe(filter((yes) => yes === true))
      .subscribe(() => {
        const run = () => {
          const board = this.current();
          return board ? this.api.remove(a.id, board.version) : null;
        };
        this.write(`Remove ${this.titleOf(a)}`, run, 'Card removed.');
      });
  }

  /** A drop from the CDK drag and drop: the list data is the column's membership id. */
  protected dropped(event: CdkDragDrop<number, number, BoardAssignment>): void {
    this.move(event.item.data, { membershipId: event.container.data, index: event.currentIndex });
  }

  protected moveBy(a: BoardAssignment, column: BoardColumn, delta: number): void {
    const index = column.cards.findIndex((c) => c.id === a.id);
    this.move(a, { membershipId: column.membershipId, index: index + delta });
  }

  protected moveToColumn(a: BoardAssignment, membershipId: number): void {
    const target = this.columns().find((c) => c.membershipId === membershipId);
    this.move(a, { membershipId, index: target?.cards.length ?? 0 });
  }

  /** Moves a card, recomputing the order body from the board as it is when the request goes out. */
  private move(a: BoardAssignment, to: CardPlace): void {
    const toName = this.columns().find((c) => c.membershipId === to.membershipId)?.name ?? '';
    const what = to.membershipId === a.operator.membershipId ? `Reorder ${this.titleOf(a)}` : `Move ${this.titleOf(a)} to ${toName}`;
    const body = (): OrderColumns | null => {
      const from = this.placeOf(a.id);
      return from ? orderAfterMove(this.columns(), from, to) : null;
    };
    const columns = body();
    if (!columns) return;
    const run = () => {
      const board = this.current();
      const cols = body();
      return board && cols ? this.api.order(this.day(), { version: board.version, columns: cols }) : null;
    };
    const names = new Map(this.columns().map((c) => [c.membershipId, c.name]));
    const board = this.current();
    this.write(what, run, null, board ? applyOrder(board, columns, names) : undefined);
  }

  private placeOf(id: number): CardPlace | null {
    for (const column of this.columns()) {
      const index = column.cards.findIndex((c) => c.id === id);
      if (index >= 0) return { membershipId: column.membershipId, index };
    }
    return null;
  }

  /** Publishes the day; with warnings standing, once the owner has seen them and said so. */
  protected publish(): void {
    const board = this.current();
    if (!board || this.busy() || this.publishBlocked()) return;
    const warnings = publishWarnings(board.conflicts);
    if (!warnings.length) return this.sendOrders();
    const data: ConfirmDialogData = {
      title: 'Publish with warnings?',
      message: `${warnings.length === 1 ? 'One warning stands' : `${warnings.length} warnings stand`} on this day's board. The work orders go out as the board stands.`,
      items: warnings.length > 8 ? [...warnings.slice(0, 7), `And ${warnings.length - 7} more on the board.`] : warnings,
      confirm: 'Publish anyway',
      cancel: 'Go back',
    };
    this.dialog
      .open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data, autoFocus: 'dialog' })
      .afterClosed()
      .pipe(filter((yes) => yes === true))
      .subscribe(() => this.sendOrders());
  }

  private sendOrders(): void {
    const board = this.current();
    if (!board || this.busy() || this.publishBlocked()) return;
    const day = this.day();
    this.busy.set(true);
    this.problem.set(null);
    this.notice.set(null);
    this.api.publish(day, board.version).subscribe({
      next: (result) => {
        this.busy.set(false);
        this.stale.set(null);
        this.board.set(result.board);
        this.notice.set(publishedText(result));
      },
      error: (err: unknown) =>
        this.failed(err, 'Publish the work orders', () => {
          const now = this.current();
          return now ? this.api.publish(day, now.version).pipe(map((r) => r.board)) : null;
        }),
    });
  }

  protected retryStale(): void {
    const notice = this.stale();
    const run = notice?.retry;
    if (!notice || !run) return;
    this.write(notice.what, run, notice.what.startsWith('Publish') ? 'Work orders published.' : 'Change applied.');
  }

  protected dismissStale(): void {
    this.stale.set(null);
  }

  /**
   * Sends one change. An `optimistic` board shows at once and is taken back if the server refuses;
   * a stale board loads the board now and keeps the change ready to apply again.
   */
  private write(what: string, run: () => Observable<Board> | null, done: string | null, optimistic?: Board): void {
    const before = this.current();
    const request = run();
    if (!before || !request || this.busy()) return;
    this.busy.set(true);
    this.problem.set(null);
    this.notice.set(null);
    this.stale.set(null);
    if (optimistic) this.board.set(optimistic);
    request.subscribe({
      next: (board) => {
        this.busy.set(false);
        this.board.set(board);
        if (done) this.notice.set(done);
      },
      error: (err: unknown) => {
        if (optimistic) this.board.set(before);
        this.failed(err, what, run);
      },
    });
  }

  private failed(err: unknown, what: string, retry: () => Observable<Board> | null): void {
    this.busy.set(false);
    const stale = staleBoardOf(err);
    if (stale) {
      this.board.set(stale.current);
      this.stale.set({ what, message: stale.message, changes: describeChanges(stale.changes, this.auth.farm()?.timeZone), retry });
      return;
    }
    this.problem.set(`${what}: ${messageOf(err)}`);
    // A refused publish may mean new hard conflicts: show the board as the server has it.
    if (what.startsWith('Publish')) this.board.reload();
  }
}

function names(list: readonly { name: string }[]): string {
  const all = list.map((p) => p.name);
  return all.length <= 1 ? (all[0] ?? '') : `${all.slice(0, -1).join(', ')} and ${all[all.length - 1]}`;
}

/**
 * What the owner sees once more before the orders go out: each soft conflict of the day (a field
 * already done, a weather no-go, a day over its hours, a machine reported down …), once.
 */
export function publishWarnings(conflicts: readonly Conflict[]): string[] {
  return [...new Set(conflicts.filter((c) => c.severity === 'soft').map((c) => c.message))];
}

/** "Work orders sent to Tomas Reyes and Milo Sorensen. Not changed, not sent again: Ada Lindqvist." */
export function publishedText(result: PublishResult): string {
  const orders = result.sent.filter((s) => s.kind === 'order');
  const withdrawn = result.sent.filter((s) => s.kind === 'withdrawn');
  const parts: string[] = [];
  if (orders.length) parts.push(`Work orders sent to ${names(orders)}.`);
  if (withdrawn.length) parts.push(`${names(withdrawn)} told they have no work that day.`);
  if (result.unchanged.length) parts.push(`Not changed, not sent again: ${names(result.unchanged)}.`);
  return parts.length ? parts.join(' ') : 'Published: nobody had a new or changed order.';
}
