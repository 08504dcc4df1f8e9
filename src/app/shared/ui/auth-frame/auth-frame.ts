import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

/** The page frame of the signed-out pages: the brand, one card, and the `h1` given as `heading`. */
@Component({
  selector: 'app-auth-frame',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatIconModule],
  templateUrl: './auth-frame.html',
  styleUrl: './auth-frame.scss',
})
export class AuthFrame {
  readonly heading = input.required<string>();
}
