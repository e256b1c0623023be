/** `terrain gsd --sensor-width-mm W --focal-mm F --image-width-px N --height-m H [--sensor-height-mm W2 --image-height-px N2]`: flat-ground GSD and footprint. */
import { footprintM, gsdCm } from '../terrain/gsd';
import { checkCamera, type Camera } from '../terrain/camera';
import { CliError, parseCommandArgs } from './io';

export const usage = 'usage: npm run -s terrain -- gsd --sensor-width-mm W --focal-mm F --image-width-px N --height-m H [--sensor-height-mm W2 --image-height-px N2]';

function num(values: Record<string, string | boolean | undefined>, flag: string, required: boolean): number | undefined {
  const v = values[flag];
  if (v === undefined) {
    if (required) throw new CliError(`gsd needs --${flag}. ${usage}`);
    return undefined;
  }
  const n = typeof v === 'string' && v.trim() !== '' ? Number(v) : NaN;
  if (!Number.isFinite(n) || n <= 0) throw new CliError(`--${flag} must be a positive number, got "${v}".`);
  return n;
}

/**
 * GSD (cm) at the height above flat ground, and the footprint across track (image width) and along track
 * (from the sensor height, or from the image height with square pixels); `footprintAlongM` is null when
 * neither is given.
 */
export async function run(args: string[]): Promise<unknown> {
  const { values, positionals } = parseCommandArgs(args, {
    'sensor-width-mm': { type: 'string' },
    'sensor-height-mm': { type: 'string' },
    'focal-mm': { type: 'string' },
    'image-width-px': { type: 'string' },
    'image-height-px': { type: 'string' },
    'height-m': { type: 'string' },
  });
  if (positionals.length > 0) throw new CliError(`gsd takes no file, got "${positionals[0]}". ${usage}`);
  const sensorWidthMm = num(values, 'sensor-width-mm', true)!;
  const focalLengthMm = num(values, 'focal-mm', true)!;
  const imageWidthPx = num(values, 'image-width-px', true)!;
  const heightM = num(values, 'height-m', true)!;
  const sensorHeightMm = num(values, 'sensor-height-mm', false);
  const imageHeightPx = num(values, 'image-height-px', false);
  const pitch = sensorWidthMm / imageWidthPx;
  // the unknown side follows from square pixels when only one of the pair is given
  const hMm = sensorHeightMm ?? (imageHeightPx !== undefined ? imageHeightPx * pitch : undefined);
  const hPx = imageHeightPx ?? (sensorHeightMm !== undefined ? Math.max(1, Math.round(sensorHeightMm / pitch)) : undefined);
  const camera: Camera = { sensorWidthMm, focalLengthMm, imageWidthPx, sensorHeightMm: hMm ?? sensorWidthMm, imageHeightPx: hPx ?? imageWidthPx };
  checkCamera(camera);
  const fp = footprintM(camera, heightM);
  return {
    gsdCm: gsdCm(camera, heightM),
    footprintAcrossM: fp.acrossM,
    footprintAlongM: hMm === undefined ? null : (hMm * heightM) / focalLengthMm,
  };
}
