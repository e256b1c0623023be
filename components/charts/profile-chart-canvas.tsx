/** The Skia part of the profile chart (victory-native CartesianChart); loaded only in the browser, after CanvasKit. */
import { DashPathEffect, Line as SkLine, Text as SkText, useFont, vec } from '@shopify/react-native-skia';
import { StyleSheet, View } from 'react-native';
import { Area, CartesianChart, Line, Scatter } from 'victory-native';
import { Inter_400Regular } from '@expo-google-fonts/inter/400Regular';
import { space } from '../theme';
import { chartInk, dashIntervals, limitDash, seriesLooks } from './chart-palette';
import type { ProfileSeries } from './profile-series';

export type ProfileChartCanvasProps = {
  series: ProfileSeries;
  lengthUnit: string;
  heightTitle: string;
  heightPx: number;
  /** Fewer ticks on narrow charts. */
  compact: boolean;
  /** Words drawn beside the height-limit line (it names its reference), when the series has one. */
  limitLabel?: string;
};

const fontSizePx = 11;
/** Whole numbers without decimals; small fractional ticks with one. */
const fmt = (v: number) => (Number.isInteger(v) || Math.abs(v) >= 10 ? v.toFixed(0) : v.toFixed(1));

export default function ProfileChartCanvas({ series, lengthUnit, heightTitle, heightPx, compact, limitLabel }: ProfileChartCanvasProps) {
  const ticks = compact ? 4 : 6;
  const font = useFont(Inter_400Regular, fontSizePx);
  const dash = (style: keyof typeof dashIntervals) => {
    const d = dashIntervals[style];
    return d ? <DashPathEffect intervals={d} /> : null;
  };
  return (
    <View style={[styles.box, { height: heightPx }]} testID="profile-chart-canvas">
      <CartesianChart
        data={series.rows}
        xKey="distance"
        yKeys={['ground', 'clearance', 'limit', 'altitude', 'gsd']}
        domain={{ x: series.distanceDomain }}
        padding={{ left: space.xs, right: space.xs, top: space.sm, bottom: space.xs }}
        xAxis={{ font, labelColor: chartInk.axis, lineColor: chartInk.grid, tickCount: ticks, formatXLabel: (v) => fmt(Number(v)), title: { text: `Distance along the line (${lengthUnit})`, font, color: chartInk.ink } }}
        yAxis={[
          { yKeys: ['ground', 'clearance', 'limit', 'altitude'], domain: series.heightDomain, font, labelColor: chartInk.axis, lineColor: chartInk.grid, tickCount: 5, formatYLabel: (v) => fmt(Number(v)), title: { text: heightTitle, font, color: chartInk.ink } },
          { yKeys: ['gsd'], axisSide: 'right', domain: series.gsdDomain, font, labelColor: chartInk.axis, lineColor: 'transparent', tickCount: 5, formatYLabel: (v) => Number(v).toFixed(2), title: { text: 'GSD (cm)', font, color: chartInk.ink } },
        ]}
      >
        {({ points, chartBounds, xScale }) => (
          <>
            <Area points={points.ground} y0={chartBounds.bottom} color={chartInk.groundFill} connectMissingData />
            {series.legs.map((leg) => {
              const x = xScale(leg.startDistance);
              return (
                <SkLine key={`leg-${leg.number}`} p1={vec(x, chartBounds.top)} p2={vec(x, chartBounds.bottom)} color={chartInk.legMark} strokeWidth={1}>
                  <DashPathEffect intervals={[3, 3]} />
                </SkLine>
              );
            })}
            {font
              ? series.legs.map((leg) => (
                  <SkText key={`leg-label-${leg.number}`} x={(xScale(leg.startDistance) + xScale(leg.endDistance)) / 2 - 6} y={chartBounds.top + fontSizePx} text={`L${leg.number}`} font={font} color={chartInk.ink} />
                ))
              : null}
            <Line points={points.ground} color={seriesLooks.ground.color} strokeWidth={seriesLooks.ground.widthPx} connectMissingData />
            <Line points={points.clearance} color={seriesLooks.clearance.color} strokeWidth={seriesLooks.clearance.widthPx} connectMissingData>
              {dash(seriesLooks.clearance.style)}
            </Line>
            {limitLabel ? (
              <>
                <Line points={points.limit} color={seriesLooks.limit.color} strokeWidth={seriesLooks.limit.widthPx} connectMissingData>
                  <DashPathEffect intervals={limitDash} />
                </Line>
                {font
                  ? (() => {
                      const first = points.limit.find((p) => typeof p.y === 'number');
                      return first ? <SkText x={first.x + 4} y={(first.y as number) - 4} text={limitLabel} font={font} color={chartInk.ink} /> : null;
                    })()
                  : null}
              </>
            ) : null}
            <Line points={points.altitude} color={seriesLooks.altitude.color} strokeWidth={seriesLooks.altitude.widthPx} connectMissingData />
            <Scatter points={points.altitude} shape="circle" radius={3.5} color={seriesLooks.altitude.color} />
            <Line points={points.gsd} color={seriesLooks.gsd.color} strokeWidth={seriesLooks.gsd.widthPx} connectMissingData>
              {dash(seriesLooks.gsd.style)}
            </Line>
            <Scatter points={points.gsd} shape="square" radius={2} color={seriesLooks.gsd.color} />
          </>
        )}
      </CartesianChart>
    </View>
  );
}

const styles = StyleSheet.create({ box: { width: '100%' } });
