/** The hillshade with shapes drawn over it (one SVG: the image and the overlay share image-pixel coordinates). */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { colors, layout, radii } from '../theme';
import { markerPath, type MapShape } from './map-shapes';

export type MapCanvasProps = {
  imageUrl: string;
  widthPx: number;
  heightPx: number;
  shapes: MapShape[];
  /** A tap or click on the map, in image pixels. */
  onTap?: (xPx: number, yPx: number) => void;
  /** Says what the map shows (and what a tap does) to assistive technology. */
  label: string;
  testID?: string;
  crosshair?: boolean;
};

const strokeScreenPx = 2;
const markerScreenPx = 11;

/** Sizes are given in screen pixels and scaled into image pixels, so markers stay readable at any zoom. */
export function MapCanvas({ imageUrl, widthPx, heightPx, shapes, onTap, label, testID, crosshair }: MapCanvasProps) {
  const [shownWidth, setShownWidth] = useState(widthPx);
  const k = shownWidth > 0 ? widthPx / shownWidth : 1; // image px per screen px
  return (
    <View
      style={[styles.frame, { aspectRatio: widthPx / heightPx }]}
      onLayout={(e) => setShownWidth(e.nativeEvent.layout.width)}
      testID={testID}
    >
      <svg
        viewBox={`0 0 ${widthPx} ${heightPx}`}
        width="100%"
        height="100%"
        role="img"
        aria-label={label}
        data-testid={testID ? `${testID}-svg` : undefined}
        style={{ display: 'block', cursor: onTap ? (crosshair ? 'crosshair' : 'pointer') : 'default', touchAction: 'manipulation' }}
        onClick={(e) => {
          if (!onTap) return;
          const r = e.currentTarget.getBoundingClientRect();
          onTap(((e.clientX - r.left) / r.width) * widthPx, ((e.clientY - r.top) / r.height) * heightPx);
        }}
      >
        <rect x={0} y={0} width={widthPx} height={heightPx} fill={colors.surfaceSunken} />
        <image href={imageUrl} x={0} y={0} width={widthPx} height={heightPx} preserveAspectRatio="none" />
        {shapes.map((s) => {
          if (s.kind === 'marker') {
            const r = ((s.sizePx ?? markerScreenPx) / 2) * k;
            const d = markerPath(s.shape, s.at[0], s.at[1], r);
            return (
              <g key={s.id}>
                {s.shape === 'cross' ? (
                  <>
                    <path d={d} stroke={colors.surface} strokeWidth={4 * k} strokeLinecap="round" />
                    <path d={d} stroke={s.fill} strokeWidth={2 * k} strokeLinecap="round" />
                  </>
                ) : (
                  <path d={d} fill={s.fill} stroke={s.stroke} strokeWidth={1.2 * k} />
                )}
                {s.label ? (
                  <text x={s.at[0] + r * 1.3} y={s.at[1] - r * 1.3} fontSize={12 * k} fontWeight={600} fill={colors.ink} stroke={colors.surface} strokeWidth={3 * k} paintOrder="stroke">
                    {s.label}
                  </text>
                ) : null}
              </g>
            );
          }
          const pts = s.points.map((p) => `${p[0]},${p[1]}`).join(' ');
          const w = (s.widthPx ?? strokeScreenPx) * k;
          const dash = s.dashed ? `${6 * k} ${4 * k}` : undefined;
          if (s.kind === 'polygon' && s.closed) {
            return <polygon key={s.id} points={pts} fill={s.fill ?? 'none'} fillOpacity={s.fillOpacity} stroke={s.stroke} strokeWidth={w} strokeDasharray={dash} strokeLinejoin="round" />;
          }
          return <polyline key={s.id} points={pts} fill="none" stroke={s.stroke} strokeWidth={w} strokeDasharray={dash} strokeLinejoin="round" strokeLinecap="round" />;
        })}
      </svg>
    </View>
  );
}

const styles = StyleSheet.create({
  frame: { width: '100%', borderRadius: radii.md, overflow: 'hidden', borderWidth: layout.borderWidthPx, borderColor: colors.line, backgroundColor: colors.surfaceSunken },
});
