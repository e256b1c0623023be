/** GSD along one flight line as an SVG chart (web): the target band, the target, the line, unknown stretches. */
import { useState } from 'react';
import { StyleSheet, View, type LayoutChangeEvent } from 'react-native';
import { colors, fontFamilies, layout, space, typeScale } from '../theme';
import { Text } from '../ui';
import { gsdChartGeometry, type ChartBox } from './gsd-chart-geometry';
import type { GsdChartProps } from './gsd-chart-props';

const heightPx = 180;
const box = (widthPx: number): ChartBox => ({
  widthPx,
  heightPx,
  padLeftPx: space.xxxl,
  padRightPx: space.md,
  padTopPx: space.md,
  padBottomPx: space.xxl,
});

/** Drawn at the measured width so labels keep their real size on a phone instead of being scaled down. */
export function GsdChart({ series, bandCm, targetCm, lineNumber, testID }: GsdChartProps) {
  const [widthPx, setWidthPx] = useState(0);
  const onLayout = (e: LayoutChangeEvent) => setWidthPx(Math.round(e.nativeEvent.layout.width));
  const g = widthPx > 0 ? gsdChartGeometry(series, bandCm, targetCm, box(widthPx)) : null;
  const b = box(widthPx);
  const label = `GSD along line ${lineNumber}: target ${targetCm.toFixed(2)} cm, band ${bandCm[0].toFixed(2)} to ${bandCm[1].toFixed(2)} cm.`;
  const tick = { fontFamily: fontFamilies.regular, fontSize: typeScale.caption.fontSize, fill: colors.inkMuted };

  return (
    <View style={styles.wrap} onLayout={onLayout} testID={testID}>
      {g ? (
        <svg width={widthPx} height={heightPx} role="img" aria-label={label}>
          {g.band ? <rect x={g.band.x} y={g.band.y} width={g.band.width} height={g.band.height} fill={colors.successSoft} /> : null}
          {g.gaps.map((gap, i) => (
            <rect key={i} x={gap.x0} y={b.padTopPx} width={Math.max(layout.borderWidthPx, gap.x1 - gap.x0)} height={heightPx - b.padTopPx - b.padBottomPx} fill={colors.cautionSoft} />
          ))}
          {g.yTicks.map((t) => (
            <g key={`y${t.label}`}>
              <line x1={b.padLeftPx} x2={widthPx - b.padRightPx} y1={t.y} y2={t.y} stroke={colors.line} strokeWidth={layout.borderWidthPx} />
              <text x={b.padLeftPx - space.xs} y={t.y} dy="0.35em" textAnchor="end" {...tick}>
                {t.label}
              </text>
            </g>
          ))}
          {g.xTicks.map((t) => (
            <text key={`x${t.label}`} x={t.x} y={heightPx - space.sm} textAnchor="middle" {...tick}>
              {t.label}
            </text>
          ))}
          {g.targetY !== null ? (
            <line x1={b.padLeftPx} x2={widthPx - b.padRightPx} y1={g.targetY} y2={g.targetY} stroke={colors.success} strokeWidth={layout.focusRingPx} strokeDasharray="6 4" />
          ) : null}
          <path d={g.path} fill="none" stroke={colors.primary} strokeWidth={layout.focusRingPx} strokeLinejoin="round" />
          {g.dots.map((d, i) => (
            <circle key={i} cx={d.x} cy={d.y} r={space.xs} fill={colors.primary} />
          ))}
        </svg>
      ) : (
        <View style={{ height: heightPx }} />
      )}
      <Text variant="caption" tone="muted">
        GSD in cm (up) against distance along the line in m. Green band: the target GSD ± tolerance; dashed: the target
        {g && g.gaps.length ? '; yellow: no ground height under those stations' : ''}.
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({ wrap: { width: '100%', gap: space.xs } });
