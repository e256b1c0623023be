/**
 * The leg sheet's sketch of its lines and the takeoff point (lines-sketch.ts): north up, with a scale bar, drawn
 * from the sheet itself so it is there offline. Line numbers sit at each line's start, thinned where lines are
 * close so they stay legible; the index card above lists every line.
 */
import type { LegSheet } from '../../contracts/flights';
import { colors, fontFamilies as fonts } from '../theme';
import { Card, Heading, Text } from '../ui';
import { linesSketch } from './lines-sketch';

const W = 360;
const H = 240;
const LABEL_ROOM_PX = 14;

export function LinesSketchCard({ sheet }: { sheet: Pick<LegSheet, 'lines' | 'datum'> }) {
  if (sheet.lines.length === 0) return null;
  const s = linesSketch(sheet.lines, sheet.datum.takeoff, { widthPx: W, heightPx: H, marginPx: 24 });
  // Label every k-th line when neighbouring starts are closer than a label's room (first and last always).
  const gaps = s.lines.slice(1).map((l, i) => Math.hypot(l.x1 - s.lines[i]!.x1, l.y1 - s.lines[i]!.y1));
  const minGap = gaps.length ? Math.max(0.1, Math.min(...gaps)) : LABEL_ROOM_PX;
  const every = Math.max(1, Math.ceil(LABEL_ROOM_PX / minGap));
  const labelled = (i: number) => i === 0 || i === s.lines.length - 1 || i % every === 0;
  const t = s.takeoff;
  // The scale bar sits in the bottom corner away from the takeoff: a takeoff at the plan's south-west (the box is fitted
  // to it, so it lands in a corner) would otherwise be drawn over the bar's label.
  const x0 = t.x < W / 2 ? W - 12 - s.scale.lengthPx : 12;
  return (
    <Card testID="lines-sketch">
      <Heading level={2}>Lines and takeoff</Heading>
      <Text variant="caption" tone="muted">
        North up, to scale, drawn from this sheet (it opens offline). Numbers mark where each line starts; the dot is the
        start. It shows no terrain or obstacles: check the site itself.
      </Text>
      <svg
        viewBox={`0 0 ${W} ${H}`}
        width="100%"
        role="img"
        aria-label={`Sketch of ${s.lines.length} flight lines and the takeoff point, north up; scale bar ${s.scale.label}.`}
        style={{ maxWidth: 560, background: colors.surfaceSunken, borderRadius: 8 }}
      >
        {s.lines.map((l) => (
          <g key={l.number} data-testid={`sketch-line-${l.number}`}>
            <line x1={l.x1} y1={l.y1} x2={l.x2} y2={l.y2} stroke={colors.primary} strokeWidth={1.5} />
            <circle cx={l.x1} cy={l.y1} r={2.2} fill={colors.primary} />
          </g>
        ))}
        {s.lines.map((l, i) =>
          labelled(i) ? (
            <text key={`n${l.number}`} x={l.x1} y={l.y1 - 4} fontSize={10} fontFamily={fonts.semibold} fill={colors.ink} textAnchor="middle">
              {l.number}
            </text>
          ) : null,
        )}
        <g data-testid="sketch-takeoff">
          <path d={`M ${t.x} ${t.y - 7} L ${t.x + 6} ${t.y + 5} L ${t.x - 6} ${t.y + 5} Z`} fill={colors.caution} stroke={colors.ink} strokeWidth={1} />
          <text x={t.x + 9} y={t.y + 4} fontSize={11} fontFamily={fonts.semibold} fill={colors.ink}>
            Takeoff
          </text>
        </g>
        <g aria-hidden>
          <path d="M 16 22 L 21 8 L 26 22 L 21 18 Z" fill={colors.ink} />
          <text x={21} y={34} fontSize={10} fontFamily={fonts.semibold} fill={colors.ink} textAnchor="middle">
            N
          </text>
        </g>
        <g data-testid="sketch-scale">
          <line x1={x0} y1={H - 12} x2={x0 + s.scale.lengthPx} y2={H - 12} stroke={colors.ink} strokeWidth={2} />
          <line x1={x0} y1={H - 16} x2={x0} y2={H - 8} stroke={colors.ink} strokeWidth={1.5} />
          <line x1={x0 + s.scale.lengthPx} y1={H - 16} x2={x0 + s.scale.lengthPx} y2={H - 8} stroke={colors.ink} strokeWidth={1.5} />
          <text x={x0} y={H - 20} fontSize={10} fontFamily={fonts.regular} fill={colors.ink}>
            {s.scale.label}
          </text>
        </g>
      </svg>
    </Card>
  );
}
