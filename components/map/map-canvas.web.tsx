/** The hillshade with shapes drawn over it (one SVG: the image and the overlay share image-pixel coordinates). */
import { useId, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { colors, layout, radii } from '../theme';
import { markerPath, type MapImageLayer, type MapShape } from './map-shapes';

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
  /** The part of the image to show, [x0, y0, x1, y1] in image pixels (default: all of it). */
  view?: readonly [number, number, number, number];
  /** Images over the hillshade and under the shapes (a coverage layer, hatching through a mask). */
  layers?: MapImageLayer[];
};

const strokeScreenPx = 2;
const markerScreenPx = 11;

/** Sizes are given in screen pixels and scaled into image pixels, so markers stay readable at any zoom. */
export function MapCanvas({ imageUrl, widthPx, heightPx, shapes, onTap, label, testID, crosshair, view, layers = [] }: MapCanvasProps) {
  const uid = useId().replace(/[^a-zA-Z0-9_-]/g, '');
  const [x0, y0, x1, y1] = view ?? [0, 0, widthPx, heightPx];
  const vw = x1 - x0;
  const vh = y1 - y0;
  const [shownWidth, setShownWidth] = useState(vw);
  const k = shownWidth > 0 ? vw / shownWidth : 1; // image px per screen px
  return (
    <View
      style={[styles.frame, { aspectRatio: vw / vh }]}
      onLayout={(e) => setShownWidth(e.nativeEvent.layout.width)}
      testID={testID}
    >
      <svg
        viewBox={`${x0} ${y0} ${vw} ${vh}`}
        width="100%"
        height="100%"
        role="img"
        aria-label={label}
        data-testid={testID ? `${testID}-svg` : undefined}
        style={{ display: 'block', cursor: onTap ? (crosshair ? 'crosshair' : 'pointer') : 'default', touchAction: 'manipulation' }}
        onClick={(e) => {
          if (!onTap) return;
          const r = e.currentTarget.getBoundingClientRect();
          onTap(x0 + ((e.clientX - r.left) / r.width) * vw, y0 + ((e.clientY - r.top) / r.height) * vh);
        }}
      >
        <defs>
          {/* Hatching where the grid has no data (the hillshade is transparent there), so a hole never looks like flat ground. */}
          <pattern id="nodata-hatch" width={8 * k} height={8 * k} patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
            <rect width={8 * k} height={8 * k} fill={colors.surfaceSunken} />
            <line x1={0} y1={0} x2={0} y2={8 * k} stroke={colors.lineStrong} strokeWidth={1.5 * k} />
          </pattern>
          {/* Hatching over cells short of the spec: dark and light strokes read on every colour of the layer below. */}
          <pattern id={`short-hatch-${uid}`} width={7 * k} height={7 * k} patternUnits="userSpaceOnUse" patternTransform="rotate(-45)">
            <line x1={0} y1={0} x2={0} y2={7 * k} stroke={colors.surface} strokeWidth={3.2 * k} />
            <line x1={0} y1={0} x2={0} y2={7 * k} stroke={colors.ink} strokeWidth={1.6 * k} />
          </pattern>
          {layers.map((l, i) =>
            l.kind === 'hatch' ? (
              <mask key={`m${i}`} id={`layer-mask-${uid}-${i}`} maskUnits="userSpaceOnUse" x={l.rect[0]} y={l.rect[1]} width={l.rect[2]} height={l.rect[3]}>
                <image href={l.href} x={l.rect[0]} y={l.rect[1]} width={l.rect[2]} height={l.rect[3]} preserveAspectRatio="none" style={{ imageRendering: 'pixelated' }} />
              </mask>
            ) : null,
          )}
        </defs>
        <rect x={0} y={0} width={widthPx} height={heightPx} fill="url(#nodata-hatch)" />
        <image href={imageUrl} x={0} y={0} width={widthPx} height={heightPx} preserveAspectRatio="none" />
        {layers.map((l, i) =>
          l.kind === 'hatch' ? (
            <rect key={`l${i}`} x={l.rect[0]} y={l.rect[1]} width={l.rect[2]} height={l.rect[3]} fill={`url(#short-hatch-${uid})`} mask={`url(#layer-mask-${uid}-${i})`} opacity={l.opacity ?? 1} data-testid={l.testID} />
          ) : (
            <image key={`l${i}`} href={l.href} x={l.rect[0]} y={l.rect[1]} width={l.rect[2]} height={l.rect[3]} preserveAspectRatio="none" opacity={l.opacity ?? 1} style={{ imageRendering: 'pixelated' }} data-testid={l.testID} />
          ),
        )}
        {shapes.map((s) => {
          if (s.kind === 'marker') {
            const r = ((s.sizePx ?? markerScreenPx) / 2) * k;
            const d = markerPath(s.shape, s.at[0], s.at[1], r);
            return (
              <g key={s.id} opacity={s.opacity}>
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
