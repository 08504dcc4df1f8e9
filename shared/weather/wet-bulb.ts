// Wet-bulb temperature and Delta T, the spraying measure of how fast a droplet evaporates.

/**
 * Wet-bulb temperature, °C, from air temperature and relative humidity at sea-level pressure, by
 * Stull's empirical fit: R. Stull (2011), "Wet-Bulb Temperature from Relative Humidity and Air
 * Temperature", J. Appl. Meteor. Climatol. 50: 2267–2269, eq. 1. The paper states it for RH 5–99 %
 * and T −20 to 50 °C, with errors from −1 °C to +0.65 °C; outside that range it is still a
 * reasonable guide, so it is not refused (the caller marks nothing special).
 * @example stullWetBulbC(20, 50) // 13.7 (the paper's worked example)
 */
export function stullWetBulbC(temperatureC: number, relativeHumidityPct: number): number {
  const T = temperatureC;
  const RH = relativeHumidityPct;
  return (
    T * Math.atan(0.151977 * Math.sqrt(RH + 8.313659)) +
    Math.atan(T + RH) -
    Math.atan(RH - 1.676331) +
    0.00391838 * RH ** 1.5 * Math.atan(0.023101 * RH) -
    4.686035
  );
}

/** Delta T, °C: dry-bulb minus wet-bulb temperature (Stull 2011 for the wet bulb). */
export const deltaTC = (temperatureC: number, relativeHumidityPct: number): number =>
  temperatureC - stullWetBulbC(temperatureC, relativeHumidityPct);
