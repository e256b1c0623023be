/** The map's overlays: zoom in / out / whole map buttons, a north arrow and a scale bar (web only, over the SVG). */
import { Pressable, StyleSheet, View, type PressableStateCallbackType } from 'react-native';
import { colors, layout, radii, space } from '../theme';
import { Text } from '../ui';
import { showFocusRing } from '../ui/focus-modality';
import type { ScaleBar } from './scale-bar';

type WebPressState = PressableStateCallbackType & { hovered?: boolean; focused?: boolean };

function MapButton({ glyph, label, onPress, disabled, testID }: { glyph: string; label: string; onPress: () => void; disabled?: boolean; testID?: string }) {
  return (
    <Pressable
      role="button"
      aria-label={label}
      aria-disabled={Boolean(disabled)}
      disabled={disabled}
      onPress={onPress}
      testID={testID}
      style={(s: WebPressState) => [styles.button, (s.hovered || s.pressed) && styles.buttonHover, disabled && styles.buttonOff, showFocusRing(s.focused) && styles.focused]}
    >
      <Text variant="label" tone={disabled ? 'muted' : 'default'} style={styles.glyph}>
        {glyph}
      </Text>
    </Pressable>
  );
}

type MapZoomControlsProps = {
  zoom: number;
  maxZoom: number;
  onZoom: (factor: number) => void;
  onReset: () => void;
  /** Arrow keys move a zoomed map while a button has focus: dx, dy as shares of the view. */
  onPanKey: (dxShare: number, dyShare: number) => void;
  testID?: string;
};

const arrowPan: Record<string, [number, number]> = { ArrowLeft: [-0.2, 0], ArrowRight: [0.2, 0], ArrowUp: [0, -0.2], ArrowDown: [0, 0.2] };

/** +, − and "whole map", reachable by Tab; the arrow keys pan while one of them has focus. */
export function MapZoomControls({ zoom, maxZoom, onZoom, onReset, onPanKey, testID }: MapZoomControlsProps) {
  return (
    <View
      style={styles.zoom}
      role="group"
      aria-label={`Map zoom, ${zoom.toFixed(1)} times. Arrow keys move a zoomed map.`}
      testID={testID}
      // react-native-web passes keydown through to the DOM; the arrows move the map instead of the page
      {...({
        onKeyDown: (e: { key: string; preventDefault: () => void }) => {
          const d = arrowPan[e.key];
          if (d && zoom > 1) {
            e.preventDefault();
            onPanKey(d[0], d[1]);
          }
        },
      } as object)}
    >
      <MapButton glyph="+" label="Zoom in" onPress={() => onZoom(2)} disabled={zoom >= maxZoom - 1e-9} testID={testID ? `${testID}-in` : undefined} />
      <MapButton glyph="−" label="Zoom out" onPress={() => onZoom(0.5)} disabled={zoom <= 1 + 1e-9} testID={testID ? `${testID}-out` : undefined} />
      <MapButton glyph="⤢" label="Show the whole map" onPress={onReset} disabled={zoom <= 1 + 1e-9} testID={testID ? `${testID}-reset` : undefined} />
    </View>
  );
}

/** A north arrow turned `northDeg` clockwise from up, with "N" in words for assistive technology. */
export function NorthArrow({ northDeg, testID }: { northDeg: number; testID?: string }) {
  const words = Math.abs(northDeg) < 0.5 || Math.abs(northDeg - 360) < 0.5 ? 'North is up' : `North is ${Math.round(northDeg > 180 ? 360 - northDeg : northDeg)}° ${northDeg > 180 ? 'left' : 'right'} of up`;
  return (
    <View style={styles.north} aria-label={words} role="img" testID={testID} {...({ 'data-north-deg': northDeg.toFixed(3) } as object)}>
      <svg width={28} height={36} viewBox="-14 -18 28 36" aria-hidden>
        <g transform={`rotate(${northDeg})`}>
          <path d="M 0 -15 L 7 5 L 0 1 L -7 5 Z" fill={colors.ink} stroke={colors.surface} strokeWidth={1.5} />
        </g>
        <text x={0} y={16} textAnchor="middle" fontSize={10} fontWeight={700} fill={colors.ink} stroke={colors.surface} strokeWidth={2.5} paintOrder="stroke">
          N
        </text>
      </svg>
    </View>
  );
}

/** A scale bar of `bar.lengthPx` screen pixels standing for `bar.label` of ground. */
export function ScaleBarView({ bar, testID }: { bar: ScaleBar; testID?: string }) {
  return (
    <View style={styles.scale} testID={testID} aria-label={`Scale bar: ${bar.label}`} role="img">
      <View style={[styles.scaleBar, { width: bar.lengthPx }]} testID={testID ? `${testID}-bar` : undefined} />
      <Text variant="caption" style={styles.scaleText} testID={testID ? `${testID}-label` : undefined}>
        {bar.label}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  zoom: { position: 'absolute', top: space.xs, right: space.xs, gap: space.xs },
  button: {
    width: layout.compactControlPx,
    height: layout.compactControlPx,
    alignItems: 'center',
    justifyContent: 'center',
    backgroundColor: colors.surface,
    borderColor: colors.lineStrong,
    borderWidth: layout.borderWidthPx,
    borderRadius: radii.md,
  },
  buttonHover: { backgroundColor: colors.surfaceSunken },
  buttonOff: { backgroundColor: colors.surfaceSunken, borderColor: colors.line },
  focused: { outlineColor: colors.focus, outlineWidth: layout.focusRingPx, outlineStyle: 'solid', outlineOffset: layout.focusRingPx },
  glyph: { fontSize: 18, lineHeight: 20 },
  north: { position: 'absolute', top: space.xs, left: space.xs, pointerEvents: 'none' },
  scale: { position: 'absolute', left: space.sm, bottom: space.sm, paddingHorizontal: space.xs, paddingVertical: space.xxs, backgroundColor: colors.surface, borderRadius: radii.sm, opacity: 0.92, pointerEvents: 'none' },
  scaleBar: { height: 6, borderWidth: layout.borderWidthPx, borderTopWidth: 0, borderColor: colors.ink },
  scaleText: { color: colors.ink },
});
