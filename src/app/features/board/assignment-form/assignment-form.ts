import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { OPERATION_INFO, OPERATIONS, type Operation } from '@shared/operations';
import { roundTo } from '@shared/round';
import {
  CARD_RULES,
  brokenCardRules,
  mayMentor,
  mentorIsNotOperator,
  settledMentor,
  worksAlone,
  type AssignmentCreate,
  type AssignmentPatch,
  type Board,
  type BoardAssignment,
} from '@shared/schemas/board';
import { type CrewMember, type Implement, type Machine, SELF_PROPELLED, type SkillLevel } from '@shared/schemas/fleet';
import { acresToHa, haToAcres } from '@shared/units';
import { type Observable } from 'rxjs';
import { AuthStore } from '../../../core/auth/auth-store';
import type { FormFields } from '../../../shared/forms/field-labels';
import { FormSubmission } from '../../../shared/forms/form-submission';
import { AreaPipe } from '../../../shared/units/area-pipe';
import { Units } from '../../../shared/units/units';
import { BoardApi } from '../board-api';
import { describeChanges, staleBoardOf } from '../stale-board';

export interface FieldOption {
  id: number;
  name: string;
  acres: number;
}

export interface AssignmentFormData {
  day: string;
  version: number;
  /** The card being edited; absent for a new card. */
  assignment?: BoardAssignment;
  /** The column a new card starts in. */
  operatorId?: number;
  fields: readonly FieldOption[];
  crew: readonly CrewMember[];
  machines: readonly Machine[];
  implements: readonly Implement[];
  /** Told of every board the server answers with, saved or stale, so the page behind stays current. */
  boardChanged: (board: Board) => void;
}

// Said of the operator beside their name: 'mentor' alone read as their role on the card.
const SKILL_WORDS: Record<SkillLevel, string> = { qualified: 'qualified', learning: 'learning', mentor: 'qualified, can mentor' };

/** Whether a machine can work an implement, by the same rule the server's conflict check uses. */
export function canWork(machine: Machine, implement: Implement): boolean {
  if (implement.machineIds.length > 0) return implement.machineIds.includes(machine.id);
  if (SELF_PROPELLED.includes(machine.kind)) return false;
  return implement.minPowerHp == null || machine.powerHp >= implement.minPowerHp;
}

/** Each key of a card's API body (new card, edit) and the box it is chosen in, by its label. */
export const ASSIGNMENT_FIELDS: FormFields = {
  fieldId: { control: 'fieldId', label: 'Field' },
  operation: { control: 'operation', label: 'Operation' },
  operatorId: { control: 'operatorId', label: 'Operator' },
  operator: { control: 'operatorId', label: 'Operator' },
  implementId: { control: 'implementId', label: 'Implement' },
  machineId: { control: 'machineId', label: 'Machine' },
  mentorId: { control: 'mentorId', label: 'Mentor' },
  mentor: { control: 'mentorId', label: 'Mentor' },
  startTime: { control: 'startTime', label: 'Start time' },
  endTime: { control: 'endTime', label: 'End time' },
  acresPlanned: { control: 'acresPlanned', label: 'Area planned' },
  note: { control: 'note', label: 'Note to the operator' },
  // Set by the board, not typed: a refusal names them above the form.
  date: { control: 'date', label: 'Day' },
  order: { control: 'order', label: 'Place in the day' },
  version: { control: 'version', label: 'Board' },
};

/**
 * Builds or edits one card of the work board. Saves itself so that a refusal keeps the dialog open
 * with everything typed and the server's message; closes with the saved board.
 */
@Component({
  selector: 'app-assignment-form',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [AreaPipe, MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, MatSelectModule, ReactiveFormsModule],
  templateUrl: './assignment-form.html',
  styleUrl: './assignment-form.scss',
})
export class AssignmentForm {
  private readonly api = inject(BoardApi);
  private readonly auth = inject(AuthStore);
  private readonly ref = inject<MatDialogRef<AssignmentForm, Board>>(MatDialogRef);
  protected readonly data = inject<AssignmentFormData>(MAT_DIALOG_DATA);

  private readonly editing = this.data.assignment;
  /** Hectares on a metric farm; the API always takes acres. */
  private readonly metric = inject(Units).system() === 'metric';
  protected readonly areaLabel = this.metric ? 'Hectares planned' : 'Acres planned';
  private readonly shownArea = this.editing
    ? this.metric
      ? roundTo(acresToHa(this.editing.acresPlanned), 2)
      : this.editing.acresPlanned
    : null;
  protected readonly title = this.editing ? `Edit card: ${this.editing.field.name}` : 'New card';
  protected readonly operations = OPERATIONS.map((op) => ({ value: op, label: OPERATION_INFO[op].label }));

  protected readonly form = new FormGroup({
    fieldId: new FormControl<number | null>(this.editing?.field.id ?? null, Validators.required),
    operation: new FormControl<Operation | null>(this.editing?.operation ?? null, Validators.required),
    operatorId: new FormControl<number | null>(this.editing?.operator.membershipId ?? this.data.operatorId ?? null, Validators.required),
    implementId: new FormControl<number | null>(this.editing?.implement.id ?? null, Validators.required),
    machineId: new FormControl<number | null>(this.editing?.machine.id ?? null, Validators.required),
    mentorId: new FormControl<number | null>(this.editing?.mentor?.membershipId ?? null),
    startTime: new FormControl(this.editing?.plannedStart ?? '', { nonNullable: true }),
    endTime: new FormControl(this.editing?.plannedEnd ?? '', { nonNullable: true }),
    acresPlanned: new FormControl<number | null>(this.shownArea, [Validators.min(0.01), Validators.max(100_000)]),
    note: new FormControl(this.editing?.note ?? '', { nonNullable: true, validators: [Validators.maxLength(1000)] }),
  });
  private readonly value = toSignal(this.form.valueChanges, { initialValue: this.form.getRawValue() });

  protected readonly version = signal(this.data.version);
  /** What others changed on the board while this dialog was open (after a refused save). */
  protected readonly staleChanges = signal<string[] | null>(null);
  private readonly submission = new FormSubmission(this.form, ASSIGNMENT_FIELDS, (err) => this.staleMessage(err));
  protected readonly busy = this.submission.busy;
  protected readonly error = this.submission.error;
  protected readonly blocked = this.submission.blocked;

  protected readonly operation = computed(() => this.value().operation ?? null);
  protected readonly operators = computed(() => {
    const op = this.operation();
    return this.data.crew
      .filter((c) => c.role === 'operator' || c.role === 'owner')
      .map((c) => {
        const level = op ? c.skills[op] : undefined;
        return { id: c.membershipId, name: c.name, skill: op ? (level ? SKILL_WORDS[level] : 'not trained') : null };
      });
  });
  protected readonly implementOptions = computed(() => {
    const op = this.operation();
    return this.data.implements.filter((i) => !op || i.operations.includes(op));
  });
  protected readonly machineOptions = computed(() => {
    const implement = this.data.implements.find((i) => i.id === this.value().implementId);
    return implement ? this.data.machines.filter((m) => canWork(m, implement)) : this.data.machines;
  });
  /** What the mentor field says of the operator: whether they need a mentor for the operation (marked when they do). */
  protected readonly mentorHint = computed((): { text: string; needed: boolean } | null => {
    const op = this.operation();
    const operator = this.data.crew.find((c) => c.membershipId === this.value().operatorId);
    if (!op || !operator) return null;
    const level = operator.skills[op];
    const label = OPERATION_INFO[op].label.toLowerCase();
    if (worksAlone(level)) return { text: `${operator.name} is qualified for ${label}: no mentor needed.`, needed: false };
    return {
      text:
        level === 'learning'
          ? `${operator.name} is learning ${label}: choose a mentor who works the same field that day.`
          : `${operator.name} is not trained for ${label}: choose a mentor.`,
      needed: true,
    };
  });
  /** Only people who may mentor the operation, never the operator, and nobody when the operator works alone. */
  protected readonly mentorOptions = computed(() => {
    const op = this.operation();
    if (!op) return [];
    const operatorId = this.value().operatorId;
    if (worksAlone(this.skillOf(operatorId, op))) return [];
    return this.data.crew.filter((c) => mayMentor(c.skills[op]) && mentorIsNotOperator({ operatorId, mentorId: c.membershipId }));
  });

  private skillOf(membershipId: number | null | undefined, op: Operation | null | undefined): SkillLevel | null {
    return (op && this.data.crew.find((c) => c.membershipId === membershipId)?.skills[op]) || null;
  }

  /**
   * After the operator or the operation changed: the mentor stays only while the operator needs one
   * (the same rule as the server's, shared/schemas/board.ts) and while they may mentor the
   * operation, so no stale mentor, or error about one, is left behind.
   */
  private settleMentor(operatorId: number | null, op: Operation | null): void {
    const mentor = this.form.controls.mentorId;
    const kept = settledMentor({ operatorId, mentorId: mentor.value, operatorSkill: this.skillOf(operatorId, op) });
    const next = kept !== null && op && !mayMentor(this.skillOf(kept, op)) ? null : kept;
    if (next !== mentor.value) mentor.setValue(next);
    // A rule error on the mentor belonged to the card as it was.
    if (mentor.hasError('rule') || mentor.hasError('server')) mentor.updateValueAndValidity();
  }

  /** A broken rule's mark goes as soon as the card keeps the rule again, whichever box fixed it (Save is off while it shows). */
  private clearKeptRules(): void {
    const raw = this.form.getRawValue();
    const broken = new Set(brokenCardRules({ ...raw, operatorSkill: this.skillOf(raw.operatorId, raw.operation) }).map((r) => r.field));
    for (const { field } of CARD_RULES) {
      const control = this.form.controls[field];
      if (control.hasError('rule') && !broken.has(field)) control.updateValueAndValidity();
    }
  }

  constructor() {
    this.form.valueChanges.subscribe(() => this.clearKeptRules());
    this.form.controls.operatorId.valueChanges.subscribe((id) => this.settleMentor(id, this.form.controls.operation.value));
    this.form.controls.operation.valueChanges.subscribe((op) => this.settleMentor(this.form.controls.operatorId.value, op));
    // Acres planned belong to a field: another field starts from what is left of it.
    this.form.controls.fieldId.valueChanges.subscribe(() => this.form.controls.acresPlanned.setValue(null));
    this.form.controls.operation.valueChanges.subscribe((op) => {
      const implement = this.data.implements.find((i) => i.id === this.form.controls.implementId.value);
      if (implement && op && !implement.operations.includes(op)) this.form.controls.implementId.setValue(null);
      // The group's value signal has not caught up yet inside a control's own change.
      const only = this.data.implements.filter((i) => op && i.operations.includes(op));
      if (only.length === 1 && this.form.controls.implementId.value == null) this.form.controls.implementId.setValue(only[0].id);
    });
    this.form.controls.implementId.valueChanges.subscribe((id) => {
      const implement = this.data.implements.find((i) => i.id === id);
      if (!implement) return;
      const machine = this.data.machines.find((m) => m.id === this.form.controls.machineId.value);
      if (machine && !canWork(machine, implement)) this.form.controls.machineId.setValue(null);
      const fits = this.data.machines.filter((m) => canWork(m, implement));
      if (fits.length === 1 && this.form.controls.machineId.value == null) this.form.controls.machineId.setValue(fits[0].id);
    });
  }

  protected save(): void {
    if (this.busy()) return;
    // The same rules between a card's fields as the server's (shared/schemas/board.ts); a rule
    // broken at the last try is looked at afresh, whichever field was changed since.
    for (const { field } of CARD_RULES) if (this.form.controls[field].hasError('rule')) this.form.controls[field].updateValueAndValidity();
    const raw = this.form.getRawValue();
    const facts = { ...raw, operatorSkill: this.skillOf(raw.operatorId, raw.operation) };
    const marked = new Set<string>();
    for (const rule of brokenCardRules(facts)) {
      // The first rule a field breaks is the one it shows, as the server would answer.
      if (marked.has(rule.field)) continue;
      marked.add(rule.field);
      this.form.controls[rule.field].setErrors({ rule: rule.message });
    }
    if (!this.submission.ready()) return;
    const request = this.request(this.version());
    if (!request) {
      this.ref.close();
      return;
    }
    this.submission.send(request, (board) => {
      this.data.boardChanged(board);
      this.ref.close(board);
    });
  }

  /** Someone changed the board first: the dialog takes the new version and says what changed. */
  private staleMessage(err: unknown): string | null {
    const stale = staleBoardOf(err);
    if (!stale) return null;
    this.version.set(stale.current.version);
    this.data.boardChanged(stale.current);
    this.staleChanges.set(describeChanges(stale.changes, this.auth.farm()?.timeZone));
    return `${stale.message} Your card was not saved yet: check it against the changes and save again.`;
  }

  private toAcres(area: number): number {
    if (this.editing && area === this.shownArea) return this.editing.acresPlanned;
    return this.metric ? roundTo(haToAcres(area), 4) : area;
  }

  private request(version: number): Observable<Board> | null {
    const v = this.form.getRawValue();
    const body: AssignmentCreate = {
      version,
      date: this.editing?.date ?? this.data.day,
      fieldId: v.fieldId!,
      operation: v.operation!,
      operatorId: v.operatorId!,
      machineId: v.machineId!,
      implementId: v.implementId!,
      mentorId: v.mentorId ?? null,
      startTime: v.startTime || null,
      endTime: v.endTime || null,
      note: v.note.trim() || null,
      ...(v.acresPlanned != null ? { acresPlanned: this.toAcres(v.acresPlanned) } : {}),
    };
    if (!this.editing) return this.api.create(body);
    const patch = changesFrom(this.editing, body);
    return patch ? this.api.update(this.editing.id, { version, ...patch }) : null;
  }
}

/**
 * Only what the owner changed on an existing card (a job already started may change only its
 * note), or null when nothing changed.
 */
export function changesFrom(a: BoardAssignment, body: AssignmentCreate): AssignmentPatch | null {
  const was: Omit<AssignmentCreate, 'version' | 'date'> = {
    fieldId: a.field.id,
    operation: a.operation,
    operatorId: a.operator.membershipId,
    machineId: a.machine.id,
    implementId: a.implement.id,
    mentorId: a.mentor?.membershipId ?? null,
    startTime: a.plannedStart,
    endTime: a.plannedEnd,
    note: a.note,
    acresPlanned: a.acresPlanned,
  };
  const patch: Record<string, unknown> = {};
  for (const key of Object.keys(was) as Array<keyof typeof was>) {
    if (key in body && body[key] !== was[key]) patch[key] = body[key];
  }
  return Object.keys(patch).length ? (patch as AssignmentPatch) : null;
}
