import { Pipe, type PipeTransform } from '@angular/core';
import { cropName } from '@shared/figures';

/**
 * `{{ field.crop | crop }}` → "Spring wheat": crop names in the one style of every screen, e-mail and
 * CSV (shared/figures.ts), whatever case they were typed in; `fallback` when there is none.
 */
@Pipe({ name: 'crop' })
export class CropPipe implements PipeTransform {
  transform(crop: string | null | undefined, fallback = '—'): string {
    return cropName(crop) ?? fallback;
  }
}
