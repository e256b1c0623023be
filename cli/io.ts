/** Command-line plumbing shared by the terrain commands: file bytes, Node's fast inflate, argument parsing, one-line errors. */
import { closeSync, openSync, writeSync } from 'node:fs';
import { open, readFile } from 'node:fs/promises';
import { inflateSync } from 'node:zlib';
import { parseArgs, type ParseArgsConfig } from 'node:util';
import { TerrainError } from '../terrain/errors';

/** A bad command line or input: printed as one line on stderr, exit code 2 (usage) or 1 (input). */
export class CliError extends Error {
  constructor(message: string, readonly exitCode = 2) {
    super(message);
  }
}

/**
 * node:zlib's inflate for readDem's `inflate` option (about 4x faster than the pure-JS one). One output chunk a
 * little larger than the expected block: zlib then never concatenates chunks, nor allocates a spare one when
 * the output fills its chunk exactly.
 */
export const nodeInflate = (data: Uint8Array, expectedBytes?: number): Uint8Array =>
  inflateSync(data, { chunkSize: Math.max(1024, (expectedBytes ?? 0) + 64) });

/** The bytes of a file, or a CliError that names the file and the reason. */
export async function readFileBytes(path: string | undefined, what = 'DEM'): Promise<Uint8Array> {
  if (!path) throw new CliError(`Give the ${what} file, e.g. DEM.tif.`);
  try {
    const buf = await readFile(path);
    return new Uint8Array(buf.buffer, buf.byteOffset, buf.byteLength);
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : code === 'EACCES' ? 'permission denied' : (err as Error).message;
    throw new CliError(`Cannot read ${what} file "${path}": ${why}.`, 1);
  }
}

/** A value that starts with a minus sign and then a digit or a point: a number (a western or southern coordinate), not an option. */
const NEGATIVE_NUMBER = /^-(\d|\.\d)/;

/**
 * `--name -121.7,45.3` as `--name=-121.7,45.3` for every option that takes a value. node:util parseArgs reads a
 * value starting with "-" as a possible option and refuses it as ambiguous; a coordinate west of Greenwich or
 * south of the equator always starts that way.
 */
function joinNegativeValues(args: readonly string[], options: NonNullable<ParseArgsConfig['options']>): string[] {
  const out: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    const next = args[i + 1];
    if (a === '--') { out.push(...args.slice(i)); break; }
    const name = a.startsWith('--') ? a.slice(2) : a.length === 2 && a[0] === '-' ? Object.keys(options).find((k) => options[k].short === a[1]) : undefined;
    if (name !== undefined && options[name]?.type === 'string' && next !== undefined && NEGATIVE_NUMBER.test(next)) {
      out.push(`--${name}=${next}`);
      i++;
    } else out.push(a);
  }
  return out;
}

/**
 * Writes a file from parts given one after the other (a part may be overwritten once the next is asked for, as
 * `float32GeoTiffParts` does), each written whole before the next is asked for.
 */
export async function writeFileParts(path: string, parts: Iterable<Uint8Array>): Promise<void> {
  const fh = await open(path, 'w');
  try {
    for (const part of parts) {
      for (let at = 0; at < part.length;) at += (await fh.write(part, at, part.length - at)).bytesWritten;
    }
  } finally {
    await fh.close();
  }
}

/** `writeFileParts` without waiting on the event loop (benchmarks and scripts). */
export function writeFilePartsSync(path: string, parts: Iterable<Uint8Array>): void {
  const fd = openSync(path, 'w');
  try {
    for (const part of parts) for (let at = 0; at < part.length;) at += writeSync(fd, part, at, part.length - at);
  } finally {
    closeSync(fd);
  }
}

/** node:util parseArgs with our error wording (strict: unknown options are errors); negative numbers are values. */
export function parseCommandArgs<T extends NonNullable<ParseArgsConfig['options']>>(args: string[], options: T) {
  try {
    return parseArgs({ args: joinNegativeValues(args, options), options, allowPositionals: true, strict: true });
  } catch (err) {
    // the whole message (node's hint included) on one line: reportError joins its lines
    throw new CliError((err as Error).message);
  }
}

/** "X,Y" to two finite numbers. */
export function parsePair(text: string, flag: string): [number, number] {
  const parts = text.split(',');
  const nums = parts.map((p) => (p.trim() === '' ? NaN : Number(p)));
  if (parts.length !== 2 || !nums.every(Number.isFinite)) throw new CliError(`${flag} needs X,Y with two numbers (lon,lat by default), got "${text}".`);
  return [nums[0], nums[1]];
}

/** Print one JSON document on stdout. */
export function printJson(doc: unknown): void {
  process.stdout.write(`${JSON.stringify(doc, null, 2)}\n`);
}

/** Report an error as one line on stderr and set the exit code (TerrainError: 1, usage: 2, anything else: 70). */
export function reportError(err: unknown): void {
  const oneLine = (s: string) => s.replace(/\s*\n\s*/g, ' ').trim();
  if (err instanceof TerrainError) {
    process.stderr.write(`error (${err.code}): ${oneLine(err.message)}\n`);
    process.exitCode = 1;
  } else if (err instanceof CliError) {
    process.stderr.write(`error: ${oneLine(err.message)}\n`);
    process.exitCode = err.exitCode;
  } else {
    process.stderr.write(`internal error: ${oneLine(err instanceof Error ? err.message : String(err))}\n`);
    process.exitCode = 70;
  }
}
