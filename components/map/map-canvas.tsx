/** Native builds draw no map yet (Loftline ships for the web; see map-canvas.web.tsx). */
import { EmptyState } from '../ui';
import type { ImageGeoref } from './image-georef';
import type { DragMove, MapImageLayer, MapShape, PxPoint } from './map-shapes';

type MapCanvasProps = {
  imageUrl: string;
  widthPx: number;
  heightPx: number;
  shapes: MapShape[];
  onTap?: (xPx: number, yPx: number) => void;
  onGrab?: (xPx: number, yPx: number, toScreen: (p: PxPoint) => [number, number]) => DragMove | null;
  label: string;
  testID?: string;
  crosshair?: boolean;
  view?: readonly [number, number, number, number];
  layers?: MapImageLayer[];
  georef?: ImageGeoref;
};

/** Says where the map can be used instead. */
export function MapCanvas({ testID }: MapCanvasProps) {
  return <EmptyState testID={testID} title="Map only in the web app" message="Open Loftline in a browser to draw areas and see results on the hillshade." />;
}
