import { ChangeDetectionStrategy, Component, ElementRef, ViewEncapsulation, effect, inject, input } from '@angular/core';
import { hazardSvg } from '../hazard-symbols';

/** One hazard kind's symbol, as on the map, for lists and legends. Decorative: pair it with text. */
@Component({
  selector: 'app-hazard-symbol',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: '',
  styleUrl: './hazard-symbol.scss',
  encapsulation: ViewEncapsulation.None,
  host: { class: 'hazard-symbol', 'aria-hidden': 'true' },
})
export class HazardSymbol {
  readonly kind = input.required<string>();

  constructor() {
    const host = inject<ElementRef<HTMLElement>>(ElementRef).nativeElement;
    // The markup is our own constant SVG (hazard-symbols.ts), never user text.
    effect(() => (host.innerHTML = hazardSvg(this.kind())));
  }
}
