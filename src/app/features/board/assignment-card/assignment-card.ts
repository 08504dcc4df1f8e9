import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { DragDropModule } from '@angular/cdk/drag-drop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { daySpan } from '@shared/farm-time';
import { OPERATION_INFO } from '@shared/operations';
import type { BoardAssignment, CardWeather, Conflict } from '@shared/schemas/board';
import { STATE_LABELS } from '@shared/schemas/jobs';
import { AreaPipe } from '../../../shared/units/area-pipe';
import { hoursText } from '../board-day';
import { VERDICT_LABELS, freshness } from '../board-weather';

export interface MoveTarget {
  membershipId: number;
  name: string;
}

/**
 * One job on the work board. Lives inside a `cdkDrag` (its handle is here); the Move menu is the
 * keyboard way to do what dragging does.
 */
@Component({
  selector: 'app-assignment-card',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [AreaPipe, DragDropModule, MatButtonModule, MatIconModule, MatMenuModule],
  templateUrl: './assignment-card.html',
  styleUrl: './assignment-card.scss',
})
export class AssignmentCard {
  readonly assignment = input.required<BoardAssignment>();
  readonly conflicts = input<readonly Conflict[]>([]);
  /** The verdict of the card's operation over its window; null: no forecast, or an operation the weather does not judge. */
  readonly weather = input<CardWeather | null>(null);
  readonly moveTargets = input<readonly MoveTarget[]>([]);
  readonly first = input(false);
  readonly last = input(false);
  /** Off while a save runs, and for jobs already started or done. */
  readonly movable = input(true);

  readonly edit = output<void>();
  readonly remove = output<void>();
  /** Open the job's coverage: its track and what it covered. */
  readonly coverage = output<void>();
  readonly moveUp = output<void>();
  readonly moveDown = output<void>();
  readonly moveTo = output<number>();

  protected readonly title = computed(
    () => `${this.assignment().field.name} ${OPERATION_INFO[this.assignment().operation].label.toLowerCase()}`,
  );
  protected readonly operationLabel = computed(() => OPERATION_INFO[this.assignment().operation].label);
  protected readonly stateLabel = computed(() => STATE_LABELS[this.assignment().state]);
  protected readonly hours = computed(() => hoursText(this.assignment().planHours));
  protected readonly source = computed(() => (this.assignment().planSource === 'pass-plan' ? 'from pass plan' : 'estimate'));
  /**
   * The times as the owner set them when the work does not fit them (the warning below says by how
   * much); otherwise the card's effective times.
   */
  protected readonly times = computed(() => {
    const a = this.assignment();
    return daySpan(a.startTime, !a.fitsWindow && a.plannedEnd ? a.plannedEnd : a.endTime);
  });
  /** A window longer than the work books the person for all of it: said, so the column's hours add up. */
  protected readonly booked = computed(() => {
    const a = this.assignment();
    return a.fitsWindow && hoursText(a.bookedHours) !== hoursText(a.planHours) ? `${hoursText(a.bookedHours)} booked` : null;
  });
  protected readonly timesSet = computed(() => this.assignment().plannedStart !== null || this.assignment().plannedEnd !== null);
  protected readonly hard = computed(() => this.conflicts().filter((c) => c.severity === 'hard'));
  protected readonly soft = computed(() => this.conflicts().filter((c) => c.severity === 'soft'));
  /** A started or finished job is called off or kept, not deleted. */
  protected readonly removable = computed(() => this.assignment().state === 'planned' || this.assignment().state === 'called-off');
  protected readonly headingId = computed(() => `card-${this.assignment().id}-title`);
  protected readonly verdictLabel = computed(() => {
    const w = this.weather();
    return w ? VERDICT_LABELS[w.verdict] : '';
  });
  protected readonly verdictIcon = computed(() => {
    const v = this.weather()?.verdict;
    return v === 'no-go' ? 'block' : v === 'caution' ? 'error_outline' : 'check_circle_outline';
  });
  /** Which hours were judged, in words. */
  protected readonly judgedOver = computed(() => {
    const w = this.weather();
    if (!w) return '';
    return w.over === 'card' ? `${w.from}–${w.to}` : `working day ${w.from}–${w.to}`;
  });
  protected readonly forecastAge = computed(() => {
    const w = this.weather();
    return w ? freshness(w) : null;
  });
}
