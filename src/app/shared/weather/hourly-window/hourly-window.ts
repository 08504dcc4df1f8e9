import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import type { JobWeather } from '@shared/schemas/run-sheet';
import { AuthStore } from '../../../core/auth/auth-store';
import { Units } from '../../units/units';
import {
  compassPoint,
  compassWords,
  formatPercent,
  formatRain,
  formatTemperature,
  formatTemperatureDifference,
  formatWind,
} from '@shared/figures';
import { ageOf, clockIn } from '../weather-format';

const VERDICT_WORDS = { go: 'Go', caution: 'Caution', 'no-go': 'No-go' } as const;

/**
 * A job's hours from the stored forecast as a compact strip that scrolls sideways on a phone: per
 * hour the temperature, wind and gusts with where the wind comes from (an arrow and compass letters,
 * said in words to a screen reader), rain and its chance, Delta T for spraying, and the verdict.
 * Above it, the window's verdict with its reasons and how old the forecast is.
 */
@Component({
  selector: 'app-hourly-window',
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './hourly-window.html',
  styleUrl: './hourly-window.scss',
})
export class HourlyWindow {
  private readonly units = inject(Units);
  private readonly auth = inject(AuthStore);

  readonly weather = input.required<JobWeather>();
  /** Delta T is shown for spraying only. */
  readonly showDeltaT = input(false);
  /** For ids and labels: the job's id. */
  readonly key = input.required<number>();

  protected readonly verdictWords = VERDICT_WORDS;
  /**
   * The reasons shown at once, worst first; the rest fold away (a cold morning gives one line an
   * hour), so the job's map and hazards below stay near the top of a phone's screen.
   */
  protected readonly firstReasons = 3;
  protected readonly age = computed(() => {
    const w = this.weather();
    if (!w.issuedAt || w.ageMinutes === null) return null;
    return `Forecast from ${clockIn(w.issuedAt, this.auth.farm()?.timeZone)}, ${ageOf(w.ageMinutes)}`;
  });
  protected readonly span = computed(() => {
    const w = this.weather();
    return w.over === 'job' ? `${w.from}–${w.to}` : `working day ${w.from}–${w.to}`;
  });
  protected readonly hours = computed(() => {
    const u = this.units.system();
    return this.weather().hours.map((h) => ({
      time: h.time.slice(11, 16),
      temperature: formatTemperature(h.temperatureC, u),
      wind: formatWind(h.windSpeedKmh, u),
      gust: formatWind(h.windGustKmh, u),
      compass: compassPoint(h.windDirectionDeg) ?? '—',
      compassWords: compassWords(h.windDirectionDeg),
      // The arrow points where the wind blows to: from the north, it points down (south).
      arrow: h.windDirectionDeg === null ? null : `rotate(${Math.round(h.windDirectionDeg + 180)}deg)`,
      rain: formatRain(h.precipitationMm, u),
      chance: formatPercent(h.precipitationProbabilityPct),
      deltaT: formatTemperatureDifference(h.deltaTC, u),
      verdict: h.verdict?.verdict ?? null,
      reason: h.verdict?.reasons[0] ?? null,
    }));
  });
}
