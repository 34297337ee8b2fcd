import { describe, expect, it } from 'vitest';
import { DEFAULT_SETTINGS, toSettings } from './settings';

describe('toSettings', () => {
  it('takes valid values as they are', () => {
    expect(toSettings({ nearClosedToleranceMm: 0.5, assumedUnit: 'mm', ignoredLayers: ['ENGRAVE', 'notes'], severity: { 'open-contour': 'warning', 'near-closed': 'off' } })).toEqual({
      nearClosedToleranceMm: 0.5,
      assumedUnit: 'mm',
      ignoredLayers: ['ENGRAVE', 'notes'],
      severity: { 'open-contour': 'warning', 'near-closed': 'off' },
    });
  });

  it('falls back to the default for each invalid value separately', () => {
    expect(toSettings({ nearClosedToleranceMm: -1, assumedUnit: 'furlong', ignoredLayers: 'NOTES', severity: { 'open-contour': 'loud', 'near-closed': 'info' } })).toEqual({
      nearClosedToleranceMm: DEFAULT_SETTINGS.nearClosedToleranceMm,
      assumedUnit: DEFAULT_SETTINGS.assumedUnit,
      ignoredLayers: DEFAULT_SETTINGS.ignoredLayers,
      severity: { 'near-closed': 'info' },
    });
    expect(toSettings({ nearClosedToleranceMm: Number.NaN }).nearClosedToleranceMm).toBe(DEFAULT_SETTINGS.nearClosedToleranceMm);
    expect(toSettings({ nearClosedToleranceMm: '0.2' }).nearClosedToleranceMm).toBe(DEFAULT_SETTINGS.nearClosedToleranceMm);
  });

  it('keeps only non-empty layer names in ignoredLayers', () => {
    expect(toSettings({ ignoredLayers: ['NOTES', 3, '', '  ', null, 'engrave'] }).ignoredLayers).toEqual(['NOTES', 'engrave']);
  });

  it('accepts a zero tolerance (only exact closure counts)', () => {
    expect(toSettings({ nearClosedToleranceMm: 0 }).nearClosedToleranceMm).toBe(0);
  });

  it('gives the defaults for a missing or malformed section', () => {
    for (const raw of [undefined, null, 42, 'x', []]) expect(toSettings(raw)).toEqual(DEFAULT_SETTINGS);
  });
});
