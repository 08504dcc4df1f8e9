import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { DEFER_TO_LAW } from '../cautions';

export interface CautionLine {
  text: string;
  /** The implements it applies to, when shown for a whole list. */
  appliesTo?: readonly string[];
}

/** Road and power-line cautions for implements, in plain words, deferring to local law. */
@Component({
  selector: 'app-implement-cautions',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  templateUrl: './implement-cautions.html',
  styleUrl: './implement-cautions.scss',
})
export class ImplementCautions {
  readonly cautions = input.required<readonly CautionLine[]>();

  protected readonly deferToLaw = DEFER_TO_LAW;
}
