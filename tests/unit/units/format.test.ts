import { describe, expect, it } from 'vitest';
import { displayUnit, formatLength, formatMass, formatPower, formatPressure, formatSpeed, formatTemperature, formatTorque, roundTo } from '@/lib/units';

describe('display formatting per unit system', () => {
  it('power: 1 W in metric, 0.01 hp in imperial (1 hp = 745.7 W, NIST SP 811)', () => {
    expect(formatPower(512.4, 'metric')).toEqual({ value: 512, unit: 'W', text: '512 W' });
    expect(formatPower(745.7, 'imperial')).toEqual({ value: 1, unit: 'hp', text: '1.00 hp' });
    expect(formatPower(250, 'imperial').text).toBe('0.34 hp');
  });

  it('torque to 0.1 in N·m or lbf·ft; 85 N·m ≈ 63 lbf·ft (common practice, no source; 85 / 1.355818 = 62.69)', () => {
    expect(formatTorque(85, 'metric').text).toBe('85.0 N·m');
    expect(formatTorque(85, 'imperial')).toEqual({ value: 62.7, unit: 'lbf·ft', text: '62.7 lbf·ft' });
  });

  it('speed to 0.1 km/h or mph: 25 km/h stored as m/s shows as 25.0 km/h; 20 mph = 8.9408 m/s', () => {
    expect(formatSpeed(25 / 3.6, 'metric').text).toBe('25.0 km/h');
    expect(formatSpeed(8.9408, 'imperial').text).toBe('20.0 mph');
    expect(formatSpeed(25 / 3.6, 'imperial').text).toBe('15.5 mph');
  });

  it('pressure: 0.1 bar or 1 psi (3.5 bar = 50.76 psi)', () => {
    expect(formatPressure(350000, 'metric').text).toBe('3.5 bar');
    expect(formatPressure(350000, 'imperial').text).toBe('51 psi');
  });

  it('length, mass and temperature', () => {
    expect(formatLength(2.3122, 'metric').text).toBe('2312 mm');
    expect(formatLength(2.3122, 'imperial').text).toBe('91.0 in');
    expect(formatMass(80, 'imperial').text).toBe('176 lb');
    expect(formatTemperature(20, 'imperial').text).toBe('68 °F');
    expect(formatTemperature(-0.2, 'metric').text).toBe('0 °C');
  });

  it('rounds half away from zero and never shows -0', () => {
    expect(roundTo(2.5, 0)).toBe(3);
    expect(roundTo(-2.5, 0)).toBe(-3);
    expect(Object.is(roundTo(-0.04, 1), 0)).toBe(true);
  });

  it('names the display unit per system for chart axes', () => {
    expect(displayUnit('speed', 'imperial')).toBe('mph');
    expect(displayUnit('torque', 'metric')).toBe('nm');
  });
});
