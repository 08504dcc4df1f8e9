import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import type { DayStrip as DayStripData, StripHour } from '@shared/schemas/board';
import type { UnitSystem } from '@shared/schemas/auth';
import { formatPercent, formatRain, formatTemperature, formatWind, weatherNumber, weatherUnit } from '@shared/figures';
import { DEFAULT_LIMITS } from '@shared/weather/limits';
import { Units } from '../../../shared/units/units';
import { freshness } from '../board-weather';

export interface StripCell {
  time: string;
  temperature: string;
  wind: string;
  rain: string;
  /** The hour in a sentence, for screen readers and the tooltip. */
  words: string;
  windy: boolean;
  wet: boolean;
}

/**
 * One hour as the strip shows it, in the farm's units: bare numbers under a header that names the
 * unit, with the digits every weather figure has (shared/figures.ts), so the strip reads as the
 * card's reasons and the run sheet do.
 */
export function stripCell(h: StripHour, units: UnitSystem): StripCell {
  const chance = h.precipitationProbabilityPct === null ? '' : `, ${formatPercent(h.precipitationProbabilityPct)} chance`;
  const words = [
    h.time,
    h.temperatureC === null ? 'no temperature' : formatTemperature(h.temperatureC, units),
    h.windSpeedKmh === null
      ? 'no wind forecast'
      : `wind ${formatWind(h.windSpeedKmh, units)}${h.windGustKmh === null ? '' : `, gusts ${formatWind(h.windGustKmh, units)}`}`,
    h.precipitationMm === null
      ? 'no rain forecast'
      : h.precipitationMm > 0
        ? `rain ${formatRain(h.precipitationMm, units)}${chance}`
        : `no rain${chance}`,
  ].join(', ');
  return {
    time: h.time,
    temperature: weatherNumber(h.temperatureC, 'temperature', units),
    wind: weatherNumber(h.windSpeedKmh, 'wind', units),
    rain: weatherNumber(h.precipitationMm, 'rain', units),
    words,
    // Shaded over the default spraying limit (shared/weather/limits.ts); each card is judged with the farm's own limits.
    windy: h.windSpeedKmh !== null && h.windSpeedKmh > DEFAULT_LIMITS.spraying.windMaxKmh,
    wet: (h.precipitationMm ?? 0) > 0,
  };
}

/**
 * The day header's hourly strip for the farm: temperature, wind and rain per hour from one
 * forecast point. A real table, so a screen reader reads it hour by hour; each column also
 * carries the hour in a sentence.
 */
@Component({
  selector: 'app-day-strip',
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './day-strip.html',
  styleUrl: './day-strip.scss',
})
export class DayStrip {
  private readonly units = inject(Units);
  readonly strip = input.required<DayStripData>();

  protected readonly cells = computed(() => this.strip().hours.map((h) => stripCell(h, this.units.system())));
  protected readonly speedUnit = computed(() => weatherUnit('wind', this.units.system()).unit);
  protected readonly rainUnit = computed(() => weatherUnit('rain', this.units.system()).unit);
  protected readonly tempUnit = computed(() => weatherUnit('temperature', this.units.system()).unit);
  protected readonly where = computed(() => {
    const s = this.strip();
    return s.basis === 'most-fields'
      ? `at the point of most of the day's fields (${s.fieldName})`
      : `at ${s.fieldName}, the farm's first field`;
  });
  protected readonly age = computed(() => freshness(this.strip()));
}
