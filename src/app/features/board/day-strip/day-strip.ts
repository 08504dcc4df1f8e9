import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import type { DayStrip as DayStripData, StripHour } from '@shared/schemas/board';
import type { UnitSystem } from '@shared/schemas/auth';
import { cToF, kmhToMph, mmToIn } from '@shared/units';
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

const dash = '–';

/** One hour as the strip shows it, in the farm's units. */
export function stripCell(h: StripHour, units: UnitSystem): StripCell {
  const us = units === 'us';
  const temp = h.temperatureC === null ? null : Math.round(us ? cToF(h.temperatureC) : h.temperatureC);
  const wind = h.windSpeedKmh === null ? null : Math.round(us ? kmhToMph(h.windSpeedKmh) : h.windSpeedKmh);
  const gust = h.windGustKmh === null ? null : Math.round(us ? kmhToMph(h.windGustKmh) : h.windGustKmh);
  const rain =
    h.precipitationMm === null ? null : us ? Math.round(mmToIn(h.precipitationMm) * 100) / 100 : Math.round(h.precipitationMm * 10) / 10;
  const speed = us ? 'mph' : 'km/h';
  const depth = us ? 'in' : 'mm';
  const chance = h.precipitationProbabilityPct === null ? '' : `, ${Math.round(h.precipitationProbabilityPct)} % chance`;
  const words = [
    h.time,
    temp === null ? 'no temperature' : `${temp} °${us ? 'F' : 'C'}`,
    wind === null ? 'no wind forecast' : `wind ${wind} ${speed}${gust === null ? '' : `, gusts ${gust}`}`,
    rain === null ? 'no rain forecast' : rain > 0 ? `rain ${rain} ${depth}${chance}` : `no rain${chance}`,
  ].join(', ');
  return {
    time: h.time,
    temperature: temp === null ? dash : `${temp}°`,
    wind: wind === null ? dash : String(wind),
    rain: rain === null ? dash : rain > 0 ? String(rain) : '0',
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
  protected readonly speedUnit = computed(() => (this.units.system() === 'us' ? 'mph' : 'km/h'));
  protected readonly rainUnit = computed(() => (this.units.system() === 'us' ? 'in' : 'mm'));
  protected readonly tempUnit = computed(() => (this.units.system() === 'us' ? '°F' : '°C'));
  protected readonly where = computed(() => {
    const s = this.strip();
    return s.basis === 'most-fields'
      ? `at the point of most of the day's fields (${s.fieldName})`
      : `at ${s.fieldName}, the farm's first field`;
  });
  protected readonly age = computed(() => freshness(this.strip()));
}
