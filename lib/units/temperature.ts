/** Temperature is stored in °C (the trade records ambient temperature that way, not in kelvin). */
export type TemperatureUnit = 'c' | 'f';

export function fahrenheitToCelsius(f: number): number {
  return ((f - 32) * 5) / 9;
}

export function celsiusToFahrenheit(c: number): number {
  return (c * 9) / 5 + 32;
}

export function temperatureToCelsius(value: number, unit: TemperatureUnit): number {
  return unit === 'c' ? value : fahrenheitToCelsius(value);
}
