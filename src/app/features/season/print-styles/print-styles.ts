import { ChangeDetectionStrategy, Component, ViewEncapsulation } from '@angular/core';

/**
 * The Season screen's print stylesheet. It must reach the app shell (navigation, top bar, the
 * scrolling container), so it is not encapsulated; Angular adds it with the Season screen and takes
 * it away when the screen closes, so no other page prints differently.
 */
@Component({
  selector: 'app-print-styles',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: '',
  styleUrl: './print-styles.scss',
  encapsulation: ViewEncapsulation.None,
})
export class PrintStyles {}
