/**
 * A plan result in parts, so that no screen reads the whole result: the overview (everything but the stations,
 * with each line's figures over its stations and one compact mark per station for the map) and one line with its
 * stations, fetched when that line is chosen. A fine-GSD plan over a large area holds tens of thousands of stations
 * (about 12 MB of JSON whole); its overview is a small fraction of that and each line page is one line's worth.
 */
import { z } from 'zod';
import { planLineSchema, planResultSchema, type PlanResultData } from './plan-result';
import { stationStatus, stationStatuses, type StationStatus } from './station-status';

type PlanLineData = PlanResultData['lines'][number];

const nn = z.number().nullable();

/** A line's figures over its stations (null where no station had a value). */
const lineDigestSchema = z.object({
  photos: z.number().int(),
  gsdMinCm: nn, gsdMedianCm: nn, gsdMaxCm: nn,
  forwardOverlapMin: nn, sideOverlapMin: nn,
  /** The same under the mission's attitude envelope (null without one: as planned only). */
  forwardOverlapGuaranteedMin: nn, sideOverlapGuaranteedMin: nn,
  /** Over the stations and the legs flown between them, as the report counts them. */
  aglMinM: nn,
  /** Stations that miss a target, and the worst status on the line ('meets' when none misses). */
  flagged: z.number().int(),
  worst: z.enum(stationStatuses),
  statusCounts: z.record(z.enum(stationStatuses), z.number().int()),
});
type LineDigest = z.infer<typeof lineDigestSchema>;

/**
 * One mark per station for the overview map, as parallel arrays: WGS 84 position rounded to 1e-7° (about 1 cm)
 * and the index of the station's status in `stationStatuses`.
 */
const stationMarksSchema = z.object({ lon: z.array(z.number()), lat: z.array(z.number()), status: z.array(z.number().int().min(0).max(stationStatuses.length - 1)) });

const overviewLineSchema = planLineSchema.omit({ stations: true }).extend({ digest: lineDigestSchema, marks: stationMarksSchema });
export type OverviewLine = z.infer<typeof overviewLineSchema>;

export const resultOverviewSchema = planResultSchema.extend({ lines: z.array(overviewLineSchema) });
export type ResultOverview = z.infer<typeof resultOverviewSchema>;

/** One line with its stations (`GET …/versions/:versionId/lines/:lineIndex`). */
export const resultLineSchema = z.object({ versionId: z.string().uuid(), line: planLineSchema });

function median(sorted: number[]): number | null {
  if (sorted.length === 0) return null;
  const m = sorted.length >> 1;
  return sorted.length % 2 ? sorted[m] : (sorted[m - 1] + sorted[m]) / 2;
}

function minOf(values: Array<number | null | undefined>): number | null {
  let m = Infinity;
  for (const v of values) if (v !== null && v !== undefined && v < m) m = v;
  return m === Infinity ? null : m;
}

/** A line's figures over its stations. */
function lineDigest(line: PlanLineData): LineDigest {
  const gsd = line.stations.map((s) => s.gsdCm).filter((v): v is number => v !== null).sort((a, b) => a - b);
  const statusCounts: Record<StationStatus, number> = { unknown: 0, height: 0, gsd: 0, overlap: 0, meets: 0 };
  let worst = stationStatuses.length - 1;
  for (const s of line.stations) {
    const st = stationStatus(s);
    statusCounts[st]++;
    worst = Math.min(worst, stationStatuses.indexOf(st));
  }
  return {
    photos: line.stations.length,
    gsdMinCm: gsd.length ? gsd[0] : null,
    gsdMedianCm: median(gsd),
    gsdMaxCm: gsd.length ? gsd[gsd.length - 1] : null,
    forwardOverlapMin: minOf(line.stations.map((s) => s.forwardOverlap)),
    sideOverlapMin: minOf(line.stations.map((s) => s.sideOverlap)),
    forwardOverlapGuaranteedMin: minOf(line.stations.map((s) => s.forwardOverlapGuaranteed)),
    sideOverlapGuaranteedMin: minOf(line.stations.map((s) => s.sideOverlapGuaranteed)),
    aglMinM: minOf([...line.stations.map((s) => s.aglM), ...line.legs.map((g) => g.aglMinM)]),
    flagged: line.stations.length - statusCounts.meets,
    worst: stationStatuses[worst],
    statusCounts,
  };
}

const round7 = (v: number) => Math.round(v * 1e7) / 1e7;

/** The overview of a whole result: every line without its stations, with its digest and its stations' marks. */
export function resultOverview(result: PlanResultData): ResultOverview {
  return {
    ...result,
    lines: result.lines.map(({ stations, ...line }) => ({
      ...line,
      digest: lineDigest({ ...line, stations }),
      marks: { lon: stations.map((s) => round7(s.lon)), lat: stations.map((s) => round7(s.lat)), status: stations.map((s) => stationStatuses.indexOf(stationStatus(s))) },
    })),
  };
}
