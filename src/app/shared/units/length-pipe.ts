import { Pipe, type PipeTransform, inject } from '@angular/core';
import { Units } from './units';

/** `{{ hazard.clearanceM | length }}` → "100 ft" or "30 m" by the farm's units (input in metres). */
@Pipe({ name: 'length', pure: false })
export class LengthPipe implements PipeTransform {
  private readonly units = inject(Units);

  transform(metres: number | null | undefined): string {
    return this.units.length(metres);
  }
}
