/**
 * The hillshade with shapes drawn over it (one SVG: the image and the overlay share one coordinate system), with
 * pan and zoom (wheel, pinch, drag, and buttons reachable by keyboard), a north arrow and a scale bar. Each image
 * pixel is drawn `aspect` times as wide as tall, its true shape on the ground (a lon/lat grid's pixels are not
 * square on the ground): the SVG's x is image x times aspect; callers keep working in image pixels.
 */
import { useEffect, useId, useMemo, useRef, useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { colors, layout, radii } from '../theme';
import { groundScale } from './ground-aspect';
import { MapZoomControls, NorthArrow, ScaleBarView } from './map-controls';
import { placeLabel } from './map-handles';
import { markerPath, type DragMove, type MapImageLayer, type MapShape, type PxPoint } from './map-shapes';
import { MAX_ZOOM, panView, zoomOf, zoomView, type View as ViewBox } from './map-view';
import { scaleBar } from './scale-bar';
import type { ImageGeoref } from './image-georef';

type MapCanvasProps = {
  imageUrl: string;
  widthPx: number;
  heightPx: number;
  shapes: MapShape[];
  /** A tap or click on the map, in image pixels. */
  onTap?: (xPx: number, yPx: number) => void;
  /**
   * A press at an image point: return a move handler to drag what is there (the map then neither pans nor takes
   * the press as a tap), or null.
   * `toScreen` gives an image point's place on screen (CSS pixels from the map's top-left corner).
   */
  onGrab?: (xPx: number, yPx: number, toScreen: (p: PxPoint) => [number, number]) => DragMove | null;
  /** Says what the map shows (and what a tap does) to assistive technology. */
  label: string;
  testID?: string;
  crosshair?: boolean;
  /** The part of the image to show, [x0, y0, x1, y1] in image pixels (default: all of it); zooming stays inside it. */
  view?: readonly [number, number, number, number];
  /** Images over the hillshade and under the shapes (a coverage layer, hatching through a mask). */
  layers?: MapImageLayer[];
  /** Where the image lies on the ground: gives the pixels' ground aspect, the scale bar and the north arrow. */
  georef?: ImageGeoref;
};

const strokeScreenPx = 2;
const markerScreenPx = 11;
/** Movement (screen px) below which a press is a tap, not a drag. */
const tapSlopPx = 4;

type Gesture =
  | { kind: 'press'; id: number; x0: number; y0: number; view0: ViewBox; moved: boolean; drag: DragMove | null }
  | { kind: 'pinch'; dist0: number; view0: ViewBox; anchor: [number, number] };

/**
 * Points covering the overlays (north arrow top left, zoom buttons top right, scale bar bottom left) on a map
 * of w x h screen pixels, every 8 px, so labels keep off them as they keep off markers.
 */
function overlayPoints(w: number, h: number): [number, number][] {
  const out: [number, number][] = [];
  const fill = (x0: number, y0: number, x1: number, y1: number) => {
    for (let x = x0; x <= x1; x += 8) for (let y = y0; y <= y1; y += 8) out.push([x, y]);
  };
  fill(4, 4, 32, 40);
  fill(w - 44, 4, w - 4, 124);
  fill(8, h - 36, 150, h - 8);
  return out;
}

/** Sizes are given in screen pixels and scaled into map units, so markers stay readable at any zoom. */
export function MapCanvas({ imageUrl, widthPx, heightPx, shapes, onTap, onGrab, label, testID, crosshair, view, layers = [], georef }: MapCanvasProps) {
  const uid = useId().replace(/[^a-zA-Z0-9_-]/g, '');
  const full = useMemo<ViewBox>(() => (view ? [view[0], view[1], view[2], view[3]] : [0, 0, widthPx, heightPx]), [view, widthPx, heightPx]);
  const [cur, setCur] = useState<ViewBox>(full);
  useEffect(() => setCur(full), [full]);
  const scale = useMemo(() => (georef ? groundScale(georef) : null), [georef]);
  const a = scale?.aspect ?? 1;
  const [x0, y0, x1, y1] = cur;
  const vw = x1 - x0;
  const vh = y1 - y0;
  const [shownWidth, setShownWidth] = useState(vw * a);
  const k = shownWidth > 0 ? (vw * a) / shownWidth : 1; // map units per screen px
  const zoom = zoomOf(cur, full);
  const svgRef = useRef<SVGSVGElement | null>(null);
  const pointers = useRef(new Map<number, [number, number]>());
  const gesture = useRef<Gesture | null>(null);
  const curRef = useRef(cur);
  curRef.current = cur;

  const toImage = (clientX: number, clientY: number, v: ViewBox = curRef.current): [number, number] => {
    const r = svgRef.current!.getBoundingClientRect();
    return [v[0] + ((clientX - r.left) / r.width) * (v[2] - v[0]), v[1] + ((clientY - r.top) / r.height) * (v[3] - v[1])];
  };
  const toScreen = (p: PxPoint): [number, number] => {
    const r = svgRef.current!.getBoundingClientRect();
    const v = curRef.current;
    return [((p[0] - v[0]) / (v[2] - v[0])) * r.width, ((p[1] - v[1]) / (v[3] - v[1])) * r.height];
  };

  // the wheel zooms about the pointer; a wheel out at the whole map scrolls the page as usual
  useEffect(() => {
    const el = svgRef.current;
    if (!el) return;
    const onWheel = (e: WheelEvent) => {
      const factor = Math.exp(-e.deltaY * (e.deltaMode === 1 ? 0.05 : 0.002));
      const v = curRef.current;
      if (factor < 1 && zoomOf(v, full) <= 1 + 1e-9) return;
      e.preventDefault();
      setCur(zoomView(v, full, factor, toImage(e.clientX, e.clientY, v)));
    };
    el.addEventListener('wheel', onWheel, { passive: false });
    return () => el.removeEventListener('wheel', onWheel);
  }, [full]);

  const onPointerDown = (e: React.PointerEvent<SVGSVGElement>) => {
    pointers.current.set(e.pointerId, [e.clientX, e.clientY]);
    e.currentTarget.setPointerCapture?.(e.pointerId);
    if (pointers.current.size === 2) {
      const [p, q] = [...pointers.current.values()];
      gesture.current = { kind: 'pinch', dist0: Math.hypot(p[0] - q[0], p[1] - q[1]) || 1, view0: curRef.current, anchor: toImage((p[0] + q[0]) / 2, (p[1] + q[1]) / 2) };
      return;
    }
    if (pointers.current.size > 2) return;
    const [xi, yi] = toImage(e.clientX, e.clientY);
    const drag = onGrab ? onGrab(xi, yi, toScreen) : null;
    gesture.current = { kind: 'press', id: e.pointerId, x0: e.clientX, y0: e.clientY, view0: curRef.current, moved: false, drag };
  };
  const onPointerMove = (e: React.PointerEvent<SVGSVGElement>) => {
    if (!pointers.current.has(e.pointerId)) return;
    pointers.current.set(e.pointerId, [e.clientX, e.clientY]);
    const g = gesture.current;
    if (!g) return;
    if (g.kind === 'pinch') {
      const [p, q] = [...pointers.current.values()];
      setCur(zoomView(g.view0, full, Math.hypot(p[0] - q[0], p[1] - q[1]) / g.dist0, g.anchor));
      return;
    }
    if (g.id !== e.pointerId) return;
    if (!g.moved && Math.hypot(e.clientX - g.x0, e.clientY - g.y0) < tapSlopPx) return;
    g.moved = true;
    if (g.drag) {
      const [xi, yi] = toImage(e.clientX, e.clientY);
      g.drag(Math.min(Math.max(xi, 0), widthPx), Math.min(Math.max(yi, 0), heightPx));
      return;
    }
    const r = svgRef.current!.getBoundingClientRect();
    const v = g.view0;
    setCur(panView(v, full, (-(e.clientX - g.x0) / r.width) * (v[2] - v[0]), (-(e.clientY - g.y0) / r.height) * (v[3] - v[1])));
  };
  const onPointerEnd = (e: React.PointerEvent<SVGSVGElement>, cancelled: boolean) => {
    if (!pointers.current.delete(e.pointerId)) return;
    const g = gesture.current;
    if (g?.kind === 'press' && g.id === e.pointerId) {
      gesture.current = null;
      if (!g.moved && !cancelled && onTap && !g.drag) {
        const [xi, yi] = toImage(e.clientX, e.clientY);
        onTap(xi, yi);
      }
    } else if (g?.kind === 'pinch' && pointers.current.size < 2) {
      gesture.current = null; // the finger left on the map neither taps nor pans until lifted
    }
  };

  // labels go where they hide no other marker (the takeoff label never covers corner 1)
  const markers = shapes.filter((s): s is Extract<MapShape, { kind: 'marker' }> => s.kind === 'marker');
  const labelPlaces = useMemo(() => {
    const out = new Map<string, ReturnType<typeof placeLabel>>();
    const kk = k > 0 ? k : 1;
    for (const m of markers) {
      if (!m.label) continue;
      // screen pixels from the shown view's top-left corner
      const onScreen = (p: PxPoint): [number, number] => [((p[0] - x0) * a) / kk, (p[1] - y0) / kk];
      const others = [...markers.filter((o) => o !== m).map((o) => onScreen(o.at)), ...overlayPoints((vw * a) / kk, vh / kk)];
      out.set(m.id, placeLabel(onScreen(m.at), (m.sizePx ?? markerScreenPx) / 2, m.label.length * 7.5 + 4, 13, others, 7, [(vw * a) / kk, vh / kk]));
    }
    return out;
  }, [markers, k, a, x0, y0, vw, vh]);

  const bar = scale && shownWidth > 0 ? scaleBar((scale.metresPerPxX * vw) / shownWidth, Math.min(140, shownWidth * 0.4)) : null;
  const X = (x: number) => x * a;
  const touchAction = onGrab || zoom > 1 + 1e-9 ? 'none' : 'pan-y';
  return (
    <View style={[styles.frame, { aspectRatio: ((full[2] - full[0]) * a) / (full[3] - full[1]) }]} onLayout={(e) => setShownWidth(e.nativeEvent.layout.width)} testID={testID}>
      <svg
        ref={svgRef}
        viewBox={`${X(x0)} ${y0} ${vw * a} ${vh}`}
        width="100%"
        height="100%"
        role="img"
        aria-label={label}
        data-testid={testID ? `${testID}-svg` : undefined}
        data-aspect={a.toFixed(6)}
        data-view={cur.map((n) => n.toFixed(2)).join(' ')}
        style={{ display: 'block', cursor: onTap ? (crosshair ? 'crosshair' : 'pointer') : zoom > 1 ? 'grab' : 'default', touchAction, userSelect: 'none' }}
        onPointerDown={onPointerDown}
        onPointerMove={onPointerMove}
        onPointerUp={(e) => onPointerEnd(e, false)}
        onPointerCancel={(e) => onPointerEnd(e, true)}
      >
        <defs>
          {/* Hatching where the grid has no data (the hillshade is transparent there), so a hole never looks like flat ground. */}
          <pattern id={`nodata-hatch-${uid}`} width={8 * k} height={8 * k} patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
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
              <mask key={`m${i}`} id={`layer-mask-${uid}-${i}`} maskUnits="userSpaceOnUse" x={X(l.rect[0])} y={l.rect[1]} width={X(l.rect[2])} height={l.rect[3]}>
                <image href={l.href} x={X(l.rect[0])} y={l.rect[1]} width={X(l.rect[2])} height={l.rect[3]} preserveAspectRatio="none" style={{ imageRendering: 'pixelated' }} />
              </mask>
            ) : null,
          )}
        </defs>
        <rect x={0} y={0} width={X(widthPx)} height={heightPx} fill={`url(#nodata-hatch-${uid})`} />
        <image href={imageUrl} x={0} y={0} width={X(widthPx)} height={heightPx} preserveAspectRatio="none" data-testid={testID ? `${testID}-image` : undefined} />
        {layers.map((l, i) =>
          l.kind === 'hatch' ? (
            <rect key={`l${i}`} x={X(l.rect[0])} y={l.rect[1]} width={X(l.rect[2])} height={l.rect[3]} fill={`url(#short-hatch-${uid})`} mask={`url(#layer-mask-${uid}-${i})`} opacity={l.opacity ?? 1} data-testid={l.testID} />
          ) : (
            <image key={`l${i}`} href={l.href} x={X(l.rect[0])} y={l.rect[1]} width={X(l.rect[2])} height={l.rect[3]} preserveAspectRatio="none" opacity={l.opacity ?? 1} style={{ imageRendering: 'pixelated' }} data-testid={l.testID} />
          ),
        )}
        {shapes.map((s) => {
          if (s.kind === 'marker') {
            const r = ((s.sizePx ?? markerScreenPx) / 2) * k;
            const cx = X(s.at[0]);
            const d = markerPath(s.shape, cx, s.at[1], r);
            const place = labelPlaces.get(s.id);
            return (
              <g key={s.id} opacity={s.opacity}>
                {s.shape === 'cross' ? (
                  <>
                    <path d={d} stroke={colors.surface} strokeWidth={4 * k} strokeLinecap="round" data-testid={testID ? `${testID}-marker-${s.id}` : undefined} />
                    <path d={d} stroke={s.fill} strokeWidth={2 * k} strokeLinecap="round" />
                  </>
                ) : (
                  <path d={d} fill={s.fill} stroke={s.stroke} strokeWidth={1.2 * k} data-testid={testID ? `${testID}-marker-${s.id}` : undefined} />
                )}
                {s.label && place ? (
                  <text x={cx + place.dx * r} y={s.at[1] + place.dy * r} textAnchor={place.anchor} fontSize={12 * k} fontWeight={600} fill={colors.ink} stroke={colors.surface} strokeWidth={3 * k} paintOrder="stroke" data-testid={testID ? `${testID}-label-${s.id}` : undefined}>
                    {s.label}
                  </text>
                ) : null}
              </g>
            );
          }
          const pts = s.points.map((p) => `${X(p[0])},${p[1]}`).join(' ');
          const w = (s.widthPx ?? strokeScreenPx) * k;
          const dash = s.dashed ? `${6 * k} ${4 * k}` : undefined;
          if (s.kind === 'polygon' && s.closed) {
            return <polygon key={s.id} points={pts} fill={s.fill ?? 'none'} fillOpacity={s.fillOpacity} stroke={s.stroke} strokeWidth={w} strokeDasharray={dash} strokeLinejoin="round" />;
          }
          return <polyline key={s.id} points={pts} fill="none" stroke={s.stroke} strokeWidth={w} strokeDasharray={dash} strokeLinejoin="round" strokeLinecap="round" />;
        })}
      </svg>
      {scale ? <NorthArrow northDeg={scale.northDeg} testID={testID ? `${testID}-north` : undefined} /> : null}
      {bar ? <ScaleBarView bar={bar} testID={testID ? `${testID}-scale` : undefined} /> : null}
      <MapZoomControls
        zoom={zoom}
        maxZoom={MAX_ZOOM}
        onZoom={(f) => setCur((v) => zoomView(v, full, f))}
        onReset={() => setCur(full)}
        onPanKey={(dx, dy) => setCur((v) => panView(v, full, dx * (v[2] - v[0]), dy * (v[3] - v[1])))}
        testID={testID ? `${testID}-zoom` : undefined}
      />
    </View>
  );
}

const styles = StyleSheet.create({
  frame: { width: '100%', borderRadius: radii.md, overflow: 'hidden', borderWidth: layout.borderWidthPx, borderColor: colors.line, backgroundColor: colors.surfaceSunken },
});
