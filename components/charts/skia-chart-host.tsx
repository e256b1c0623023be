/** Loads CanvasKit with WithSkiaWeb and then the chart canvas; itself loaded lazily so neither enters the main bundle. */
import { WithSkiaWeb } from '@shopify/react-native-skia/lib/module/web';
import type { ReactNode } from 'react';
import type { ProfileChartCanvasProps } from './profile-chart-canvas';

/** CanvasKit's wasm is copied into public/ by the build and served by our own server (no CDN). */
const skiaOpts = { locateFile: () => '/canvaskit.wasm' };
const loadCanvas = () => import('./profile-chart-canvas');

export default function SkiaChartHost({ fallback, ...props }: ProfileChartCanvasProps & { fallback: ReactNode }) {
  return <WithSkiaWeb getComponent={loadCanvas} opts={skiaOpts} fallback={fallback} componentProps={props} />;
}
