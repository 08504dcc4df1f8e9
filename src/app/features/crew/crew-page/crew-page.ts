import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { type MatSelect, MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { OPERATION_INFO, OPERATIONS, type Operation } from '@shared/operations';
import type { CrewMember } from '@shared/schemas/fleet';
import { messageOf } from '../../../core/http/api-error';
import { CREW_URL, CrewApi, type SkillChoice } from '../crew-api';

export const SKILL_CHOICES: readonly { value: SkillChoice; label: string; meaning: string }[] = [
  { value: 'none', label: 'None', meaning: 'not given this operation' },
  { value: 'learning', label: 'Learning', meaning: 'may be assigned only with a mentor on the same day and field' },
  { value: 'qualified', label: 'Qualified', meaning: 'works it alone' },
  { value: 'mentor', label: 'Mentor', meaning: 'qualified, and may teach a learner working beside them' },
];

const ROLE_ORDER = { owner: 0, operator: 1, viewer: 2 } as const;

/** Who may do which operation: one row per person who works in the field, one select per operation. */
@Component({
  selector: 'app-crew-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatProgressBarModule, MatSelectModule, MatTableModule],
  templateUrl: './crew-page.html',
  styleUrl: './crew-page.scss',
})
export class CrewPage {
  private readonly api = inject(CrewApi);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly crew = httpResource<CrewMember[]>(() => CREW_URL, { defaultValue: [] });
  /** Owners and operators; viewers do no field work. */
  protected readonly rows = computed(() =>
    this.crew.hasValue()
      ? this.crew
          .value()
          .filter((c) => c.role !== 'viewer')
          .sort((a, b) => ROLE_ORDER[a.role] - ROLE_ORDER[b.role] || a.name.localeCompare(b.name))
      : [],
  );
  protected readonly loadError = computed(() => {
    const error = this.crew.error();
    return error ? messageOf(error) : null;
  });
  protected readonly operations = OPERATIONS.map((op) => ({ op, label: OPERATION_INFO[op].label }));
  protected readonly columns = ['name', ...OPERATIONS];
  protected readonly choices = SKILL_CHOICES;

  protected levelOf(member: CrewMember, op: Operation): SkillChoice {
    return member.skills[op] ?? 'none';
  }

  protected change(member: CrewMember, op: Operation, level: SkillChoice, select: MatSelect): void {
    const before = this.levelOf(member, op);
    if (level === before) return;
    this.api.setSkill(member.membershipId, op, level).subscribe({
      next: (saved) => {
        this.crew.update((list) => list.map((c) => (c.membershipId === saved.membershipId ? saved : c)));
        this.tell(sentence(saved.name, OPERATION_INFO[op].label, level));
      },
      error: (err: unknown) => {
        select.value = before;
        this.tell(messageOf(err));
      },
    });
  }

  private tell(message: string): void {
    this.snackBar.open(message, 'Close', { duration: 6000 });
  }
}

/** "Milo Sorensen is now learning harrowing." */
export function sentence(name: string, operation: string, level: SkillChoice): string {
  const op = operation.toLowerCase();
  switch (level) {
    case 'none':
      return `${name} is no longer set for ${op}.`;
    case 'learning':
      return `${name} is now learning ${op}.`;
    case 'qualified':
      return `${name} is now qualified for ${op}.`;
    case 'mentor':
      return `${name} is now a mentor for ${op}.`;
  }
}
