/** Drawing on the hillshade: taps become corners or the takeoff point; files become areas; all checked on the way in. */
import { useCallback, useMemo, useReducer, useState } from 'react';
import type { Polygon } from 'geojson';
import { colors } from '../theme';
import { checkTakeoff, ringToPolygon, type LonLat } from './area-check';
import { drawingReducer, initialDrawing, type DrawTool } from './area-drawing';
import { AreaImportError, parseAreaFile } from './area-import';
import type { ImageGeoref } from './image-georef';
import { nextCorner, nudgedCorner, type NudgeDirection } from './corner-keys';
import { groundScale } from './ground-aspect';
import { pickHandle } from './map-handles';
import type { DragMove, MapShape, PxPoint } from './map-shapes';

/** A press this close (screen px) to a corner or the takeoff point grabs it (about a fingertip). */
const grabReachPx = 16;

export type AreaDrawing = ReturnType<typeof useAreaDrawing>;

/** `initialArea` and `initialTakeoff` come from a saved plan. */
export function useAreaDrawing(georef: ImageGeoref, initialArea?: Polygon | null, initialTakeoff?: { lon: number; lat: number } | null) {
  const reducer = useMemo(() => drawingReducer(georef), [georef]);
  const [state, dispatch] = useReducer(reducer, undefined, () =>
    initialDrawing(
      initialArea?.coordinates[0]?.map((p) => [p[0], p[1]] as LonLat) ?? null,
      initialTakeoff ? [initialTakeoff.lon, initialTakeoff.lat] : null,
    ),
  );
  const [importError, setImportError] = useState<string | null>(null);
  /** The corner last pressed or dragged (0-based), which "Remove corner" removes. */
  const [selectedCorner, setSelectedCorner] = useState<number | null>(null);

  const tapPx = useCallback(
    (xPx: number, yPx: number) => {
      setImportError(null);
      dispatch({ type: 'tap', at: georef.toLonLat(xPx, yPx) });
    },
    [georef],
  );

  const importFile = useCallback(async (file: File) => {
    setImportError(null);
    try {
      const text = await file.text();
      const got = parseAreaFile(file.name, text);
      dispatch({ type: 'import', ring: got.ring, note: got.note });
    } catch (e) {
      setImportError(e instanceof AreaImportError ? e.message : `Could not read "${file.name}": ${(e as Error).message}`);
    }
  }, []);

  const toPx = useCallback((p: LonLat): PxPoint => georef.toPixel(p[0], p[1]), [georef]);
  /** Ground length of one keyboard step (one hillshade pixel) across and down the map, metres. */
  const stepM = useMemo(() => {
    const g = groundScale(georef);
    return { across: g.metresPerPxX, down: g.metresPerPxY };
  }, [georef]);

  /** A press on a corner (or, away from every corner, on the takeoff point) drags it; elsewhere the map pans. */
  const grab = useCallback(
    (xPx: number, yPx: number, toScreen: (p: PxPoint) => [number, number]): DragMove | null => {
      const hit = pickHandle(toScreen([xPx, yPx]), state.corners.map((c) => toScreen(toPx(c))), state.takeoff ? toScreen(toPx(state.takeoff)) : null, grabReachPx);
      if (!hit) return null;
      setImportError(null);
      if (hit.kind === 'corner') {
        setSelectedCorner(hit.index);
        return (x, y) => dispatch({ type: 'moveCorner', index: hit.index, at: georef.toLonLat(x, y) });
      }
      return (x, y) => dispatch({ type: 'moveTakeoff', at: georef.toLonLat(x, y) });
    },
    [state.corners, state.takeoff, toPx, georef],
  );

  const shapes = useMemo<MapShape[]>(() => {
    const out: MapShape[] = [];
    const px = state.corners.map(toPx);
    if (px.length > 0) {
      out.push({ kind: 'polygon', id: 'area', points: px, closed: state.closed, stroke: colors.primary, fill: state.closed ? colors.primary : undefined, fillOpacity: 0.14, dashed: !state.closed, widthPx: 2.5 });
    }
    // the takeoff point under the corners, so a corner beside it always shows (and is what a press there grabs)
    if (state.takeoff) out.push({ kind: 'marker', id: 'takeoff', at: toPx(state.takeoff), shape: 'diamond', fill: colors.ink, stroke: colors.surface, sizePx: 16, label: 'Takeoff' });
    px.forEach((p, i) =>
      out.push({ kind: 'marker', id: `corner-${i}`, at: p, shape: i === selectedCorner ? 'square' : 'circle', fill: i === 0 ? colors.primary : colors.surface, stroke: colors.primary, sizePx: i === selectedCorner ? 13 : 10, label: i === selectedCorner ? `${i + 1} (chosen)` : String(i + 1) }),
    );
    return out;
  }, [state.corners, state.closed, state.takeoff, toPx, selectedCorner]);

  // Stable objects, so effects that copy them into a form run only when the drawing really changed.
  const polygon = useMemo(() => (state.closed ? ringToPolygon(state.corners) : null), [state.closed, state.corners]);
  const takeoff = useMemo(() => (state.takeoff ? { lon: state.takeoff[0], lat: state.takeoff[1] } : null), [state.takeoff]);
  const takeoffProblem = useMemo(() => (state.takeoff ? checkTakeoff(state.takeoff, georef) : null), [state.takeoff, georef]);

  return {
    state,
    shapes,
    tapPx,
    importFile,
    importError,
    grab,
    selectedCorner: selectedCorner !== null && selectedCorner < state.corners.length ? selectedCorner : null,
    removeSelected: () => {
      if (selectedCorner === null) return;
      dispatch({ type: 'removeCorner', index: selectedCorner });
      setSelectedCorner(null);
    },
    /** Choose the next (+1) or previous (-1) corner, for moving or removing it from the keyboard. */
    chooseCorner: (delta: 1 | -1) => setSelectedCorner((i) => nextCorner(i !== null && i < state.corners.length ? i : null, state.corners.length, delta)),
    /** Move the chosen corner one hillshade pixel; a closed area is checked again as after a drag. */
    nudgeSelected: (direction: NudgeDirection) => {
      if (selectedCorner === null || selectedCorner >= state.corners.length) return;
      setImportError(null);
      dispatch({ type: 'moveCorner', index: selectedCorner, at: nudgedCorner(georef, state.corners[selectedCorner]!, direction) });
    },
    stepM,
    undo: () => dispatch({ type: 'undo' }),
    close: () => dispatch({ type: 'close' }),
    clear: () => {
      setSelectedCorner(null);
      dispatch({ type: 'clear' });
    },
    setTool: (tool: DrawTool) => dispatch({ type: 'tool', tool }),
    /** The area to save: only once closed and checked. */
    polygon,
    takeoff,
    takeoffProblem,
  };
}
