/** The state of drawing a survey area and placing the takeoff point: a pure reducer, so it is tested without React. */
import { checkArea, openRing, type AreaProblem, type LonLat } from './area-check';
import type { ImageGeoref } from './image-georef';

/** What a tap on the map does: add an area corner, or set the takeoff point. */
export type DrawTool = 'area' | 'takeoff';

export interface DrawingState {
  corners: LonLat[];
  /** True once the ring is closed and passed the checks. */
  closed: boolean;
  takeoff: LonLat | null;
  tool: DrawTool;
  /** Why the last close or import was refused; cleared by the next edit. */
  problem: AreaProblem | null;
  /** A remark about the last import (e.g. holes left out). */
  note: string | null;
  /** True while a closed area is open again because a moved or removed corner broke its checks. */
  reopened?: boolean;
}

type DrawingAction =
  | { type: 'tap'; at: LonLat }
  | { type: 'undo' }
  | { type: 'close' }
  | { type: 'clear' }
  | { type: 'tool'; tool: DrawTool }
  | { type: 'import'; ring: LonLat[]; note: string | null }
  | { type: 'moveCorner'; index: number; at: LonLat }
  | { type: 'removeCorner'; index: number }
  | { type: 'moveTakeoff'; at: LonLat };

/** A drawing started empty, or from a saved area and takeoff. */
export function initialDrawing(area?: LonLat[] | null, takeoff?: LonLat | null): DrawingState {
  const corners = area ? openRing(area) : [];
  return { corners, closed: corners.length >= 3, takeoff: takeoff ?? null, tool: corners.length >= 3 ? 'takeoff' : 'area', problem: null, note: null };
}

/** The next drawing state; `georef` places the taps on the grid for the checks. */
export function drawingReducer(georef: ImageGeoref) {
  /** After a corner moved or went: a closed area stays closed while it passes the checks, else opens with the reason. */
  const recheck = (s: DrawingState, corners: LonLat[]): DrawingState => {
    if (!(s.closed || s.reopened)) return { ...s, corners, problem: null, note: null };
    if (corners.length < 3) return { ...s, corners, closed: false, reopened: false, problem: null, note: null };
    const problem = checkArea(corners, georef);
    return problem ? { ...s, corners, closed: false, reopened: true, problem, note: null } : { ...s, corners, closed: true, reopened: false, problem: null, note: null };
  };
  return (s: DrawingState, a: DrawingAction): DrawingState => {
    switch (a.type) {
      case 'moveCorner':
        if (a.index < 0 || a.index >= s.corners.length) return s;
        return recheck(s, s.corners.map((c, i) => (i === a.index ? a.at : c)));
      case 'removeCorner':
        if (a.index < 0 || a.index >= s.corners.length) return s;
        return recheck(s, s.corners.filter((_, i) => i !== a.index));
      case 'moveTakeoff':
        return { ...s, takeoff: a.at, problem: s.problem };
      case 'tap':
        if (s.tool === 'takeoff') return { ...s, takeoff: a.at, problem: null };
        if (s.closed || s.reopened) return s; // a closed area changes by moving corners, undo or clear, not by stray taps
        return { ...s, corners: [...s.corners, a.at], problem: null, note: null };
      case 'undo':
        if (s.closed) return { ...s, closed: false, reopened: false, tool: 'area', problem: null };
        return { ...s, corners: s.corners.slice(0, -1), reopened: false, problem: null };
      case 'close': {
        const problem = checkArea(s.corners, georef);
        if (problem) return { ...s, problem };
        return { ...s, closed: true, reopened: false, tool: s.takeoff ? s.tool : 'takeoff', problem: null };
      }
      case 'clear':
        return { ...s, corners: [], closed: false, reopened: false, tool: 'area', problem: null, note: null };
      case 'tool':
        return { ...s, tool: a.tool };
      case 'import': {
        const corners = openRing(a.ring);
        const problem = checkArea(corners, georef);
        if (problem) return { ...s, problem, note: a.note };
        return { ...s, corners, closed: true, tool: s.takeoff ? s.tool : 'takeoff', problem: null, note: a.note };
      }
    }
  };
}
