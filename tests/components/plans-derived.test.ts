import { describe, expect, it } from 'vitest';
import { deriveValues } from '../../components/plans/derived-values';
import { numberToText, parseNumberText, scaleRangeMessage } from '../../components/plans/number-text';
import { fieldMessage, formPathOf } from '../../components/plans/plan-form-schema';
import { formatDuration, formatLength, formatSpeed, fromDisplayLength, metresPerFoot } from '../../components/projects/units';
import { cameraPreset } from '../../terrain/camera';

const oneInch = cameraPreset('one-inch-20mp-8.8mm')!.camera;

describe('deriveValues', () => {
  const input = { camera: oneInch, targetGsdCm: 3, gsdTolerance: 0.1, forwardOverlap: 0.8, sideOverlap: 0.7, maxAglM: 120 };

  it('gives the height for the target GSD from GSD = H p / f (worked by hand: p = 13.2 mm / 5472 px, f = 8.8 mm → 109.44 m for 3 cm)', () => {
    // Formula: Wolf, Dewitt & Wilkinson, Elements of Photogrammetry, ch. 6 (scale = f / H); arithmetic by hand.
    const d = deriveValues(input)!;
    expect(d.heightM).toBeCloseTo((3 * 8.8) / ((13.2 / 5472) * 100), 9);
    expect(d.heightM).toBeCloseTo(109.44, 2);
  });

  it('gives footprint, spacing and trigger distance at that height (S = (1 - side) x across, B = (1 - forward) x along)', () => {
    const d = deriveValues(input)!;
    expect(d.footprintAcrossM).toBeCloseTo((13.2 * d.heightM) / 8.8, 9); // 5472 px x 3 cm = 164.16 m
    expect(d.footprintAcrossM).toBeCloseTo(164.16, 2);
    expect(d.footprintAlongM).toBeCloseTo(109.44, 2); // 3648 px x 3 cm
    expect(d.lineSpacingM).toBeCloseTo(0.3 * 164.16, 2);
    expect(d.triggerDistanceM).toBeCloseTo(0.2 * 109.44, 2);
  });

  it('scales the height band with the GSD tolerance and flags a target above the maximum height', () => {
    const d = deriveValues(input)!;
    expect(d.bandLowM).toBeCloseTo(d.heightM * 0.9, 9);
    expect(d.bandHighM).toBeCloseTo(d.heightM * 1.1, 9);
    expect(d.aboveMaxAgl).toBe(false);
    expect(deriveValues({ ...input, targetGsdCm: 4 })!.aboveMaxAgl).toBe(true); // 145.9 m > 120 m
  });

  it('returns null while the camera or the targets are incomplete or out of range', () => {
    expect(deriveValues({ ...input, camera: { ...oneInch, focalLengthMm: undefined } })).toBeNull();
    expect(deriveValues({ ...input, targetGsdCm: undefined })).toBeNull();
    expect(deriveValues({ ...input, sideOverlap: 1 })).toBeNull();
    expect(deriveValues({ ...input, forwardOverlap: Number.NaN })).toBeNull();
  });
});

describe('number text', () => {
  it('reads decimal points and commas, an empty field as no value, and anything else as NaN', () => {
    expect(parseNumberText('12.5')).toBe(12.5);
    expect(parseNumberText('12,5')).toBe(12.5);
    expect(parseNumberText('  ')).toBeUndefined();
    expect(parseNumberText('12m')).toBeNaN();
    expect(parseNumberText('1e3')).toBe(1000);
  });

  it('shows fractions as percentages without float noise and reads them back', () => {
    expect(numberToText(0.7, 100)).toBe('70');
    expect(numberToText(0.57, 100)).toBe('57');
    expect(parseNumberText('75', 100)).toBe(0.75);
    expect(numberToText(undefined)).toBe('');
  });
});

describe('field messages', () => {
  it('restates a fraction range of the mission schema in the percent the field shows', () => {
    expect(scaleRangeMessage('Must be a number from 0 to 0.95.', 100, '%')).toBe('Must be a number from 0 to 95 %.');
    expect(scaleRangeMessage('Must be a number from 0.1 to 100.', 1, 'cm')).toBe('Must be a number from 0.1 to 100.');
    expect(scaleRangeMessage('Enter a number.', 100, '%')).toBe('Enter a number.');
  });

  it('drops the code name a schema message starts with, and maps server paths onto form paths', () => {
    expect(fieldMessage('sideOverlap must be a number from 0 to 0.95.')).toBe('Must be a number from 0 to 0.95.');
    expect(fieldMessage('camera.focalLengthMm must be above 0.')).toBe('Must be above 0.');
    expect(formPathOf('input.targetGsdCm')).toBe('mission.targetGsdCm');
    expect(formPathOf('input.camera.focalLengthMm')).toBe('mission.camera.focalLengthMm');
    expect(formPathOf('name')).toBe('name');
  });
});

describe('display units', () => {
  it('uses the international foot of exactly 0.3048 m (1959 agreement)', () => {
    expect(metresPerFoot).toBe(0.3048);
    expect(formatLength(121.92, 'imperial')).toBe('400 ft');
    expect(fromDisplayLength(400, 'imperial')).toBeCloseTo(121.92, 12);
    expect(formatLength(121.92, 'metric', 1)).toBe('121.9 m');
  });

  it('formats speeds, durations and missing values', () => {
    expect(formatSpeed(10, 'metric')).toBe('10.0 m/s');
    expect(formatSpeed(3.048, 'imperial')).toBe('10.0 ft/s');
    expect(formatDuration(750)).toBe('12 min 30 s');
    expect(formatDuration(3900)).toBe('1 h 05 min');
    expect(formatLength(null, 'metric')).toBe('–');
  });
});
