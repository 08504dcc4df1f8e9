import { Pipe, type PipeTransform, inject } from '@angular/core';
import { Units } from './units';

/**
 * `{{ field.acres | area }}` → "159.6 ac" or "64.6 ha" by the farm's units. Impure so that a units
 * switch shows at once (formatting a number is cheap).
 */
@Pipe({ name: 'area', pure: false })
export class AreaPipe implements PipeTransform {
  private readonly units = inject(Units);

  transform(acres: number | null | undefined): string {
    return this.units.area(acres);
  }
}
