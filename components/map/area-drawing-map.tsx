/** The area editor: the hillshade to tap on, the tool choice, undo / close / clear, and GeoJSON or KML import. */
import { StyleSheet, View } from 'react-native';
import { FilePicker } from '../sites/file-picker';
import { space } from '../theme';
import { Banner, Button, ChoiceGroup, Text } from '../ui';
import { formatLength } from '../projects/units';
import type { DrawTool } from './area-drawing';
import type { NudgeDirection } from './corner-keys';
import type { ImageGeoref } from './image-georef';
import { MapCanvas } from './map-canvas';
import type { AreaDrawing } from './use-area-drawing';

const toolChoices: { value: DrawTool; label: string }[] = [
  { value: 'area', label: 'Add area corners' },
  { value: 'takeoff', label: 'Set takeoff point' },
];

type AreaDrawingMapProps = {
  drawing: AreaDrawing;
  /** Where the hillshade lies on the ground (true shape, scale bar, north arrow). */
  georef?: ImageGeoref;
  imageUrl: string;
  widthPx: number;
  heightPx: number;
  /** Without plan:write the map only shows the saved area. */
  editable: boolean;
  /** A server or form message about the area or the takeoff point. */
  fieldError?: string;
};

function statusLine(d: AreaDrawing['state']): string {
  const corners = `${d.corners.length} corner${d.corners.length === 1 ? '' : 's'}`;
  const area = d.closed ? `${corners}, area closed` : d.corners.length === 0 ? 'No area yet' : `${corners}, not closed yet`;
  return `${area} · ${d.takeoff ? 'takeoff set' : 'no takeoff point'}`;
}

/** Taps add corners in order; "Close area" checks the ring (on the grid, not crossing itself) before accepting it. */
export function AreaDrawingMap({ drawing, georef, imageUrl, widthPx, heightPx, editable, fieldError }: AreaDrawingMapProps) {
  const { state } = drawing;
  const hint = !editable
    ? 'The survey area and takeoff point of this plan.'
    : state.tool === 'takeoff'
      ? 'Tap the hillshade where the aircraft takes off.'
      : state.closed
        ? 'The area is closed. Drag a corner to move it (or choose it with Next corner and move it with the arrow buttons); press one, then Remove corner, to take it out. Undo reopens the area; Clear starts again.'
        : 'Tap the hillshade to add corners in order, then close the area. Drag a corner to move it, or choose it with Next corner and move it with the arrow buttons.';
  return (
    <View style={styles.wrap} testID="area-editor">
      {editable ? (
        <View style={styles.toolbar}>
          <ChoiceGroup label="What a tap on the map does" choices={toolChoices} value={state.tool} onChange={drawing.setTool} testID="map-tool" />
        </View>
      ) : null}
      <Text variant="caption" tone="muted">
        {hint}
      </Text>
      <MapCanvas
        imageUrl={imageUrl}
        widthPx={widthPx}
        heightPx={heightPx}
        shapes={drawing.shapes}
        onTap={editable ? drawing.tapPx : undefined}
        onGrab={editable ? drawing.grab : undefined}
        georef={georef}
        crosshair
        label={`Hillshade of the elevation grid. ${statusLine(state)}.`}
        testID="area-map"
      />
      <Text variant="label" testID="area-status">
        {statusLine(state)}
      </Text>
      {state.problem ? <Banner tone="danger" title="That area cannot be used" message={state.problem.message} testID="area-problem" /> : null}
      {drawing.importError ? <Banner tone="danger" title="The file was not imported" message={drawing.importError} testID="area-import-error" /> : null}
      {drawing.takeoffProblem ? <Banner tone="danger" message={drawing.takeoffProblem} testID="takeoff-problem" /> : null}
      {state.note ? <Banner tone="info" message={state.note} /> : null}
      {fieldError ? <Banner tone="danger" message={fieldError} testID="area-field-error" /> : null}
      {editable && state.corners.length > 0 ? <CornerKeys drawing={drawing} /> : null}
      {editable ? (
        <View style={styles.actions}>
          <Button label="Undo" variant="secondary" size="compact" onPress={drawing.undo} disabled={state.corners.length === 0} testID="area-undo" />
          <Button
            label={drawing.selectedCorner !== null ? `Remove corner ${drawing.selectedCorner + 1}` : 'Remove corner'}
            accessibilityLabel={drawing.selectedCorner !== null ? `Remove corner ${drawing.selectedCorner + 1}` : 'Remove corner: press a corner on the map first'}
            variant="secondary"
            size="compact"
            onPress={drawing.removeSelected}
            disabled={drawing.selectedCorner === null}
            testID="area-remove-corner"
          />
          <Button label="Close area" variant="secondary" size="compact" onPress={drawing.close} disabled={state.closed || state.corners.length < 3} testID="area-close" />
          <Button label="Clear" variant="quiet" size="compact" onPress={drawing.clear} disabled={state.corners.length === 0} testID="area-clear" />
          <FilePicker label="Import GeoJSON or KML" accept=".geojson,.json,.kml,application/geo+json,application/vnd.google-earth.kml+xml" onPick={(f) => void drawing.importFile(f)} size="compact" testID="area-import" />
        </View>
      ) : null}
    </View>
  );
}

const arrows: { direction: NudgeDirection; glyph: string; words: string }[] = [
  { direction: 'up', glyph: '↑', words: 'up' },
  { direction: 'down', glyph: '↓', words: 'down' },
  { direction: 'left', glyph: '←', words: 'left' },
  { direction: 'right', glyph: '→', words: 'right' },
];

/** Choosing and moving a corner by buttons, for keyboards and switch access; a step is one hillshade pixel. */
function CornerKeys({ drawing }: { drawing: AreaDrawing }) {
  const chosen = drawing.selectedCorner;
  const n = drawing.state.corners.length;
  const stepWords = (d: NudgeDirection) => formatLength(d === 'up' || d === 'down' ? drawing.stepM.down : drawing.stepM.across, 'metric', 1);
  return (
    <View style={styles.actions} testID="corner-keys">
      <Button label="Previous corner" variant="secondary" size="compact" onPress={() => drawing.chooseCorner(-1)} testID="corner-previous" />
      <Button label="Next corner" variant="secondary" size="compact" onPress={() => drawing.chooseCorner(1)} testID="corner-next" />
      {arrows.map((a) => (
        <Button
          key={a.direction}
          label={a.glyph}
          accessibilityLabel={chosen !== null ? `Move corner ${chosen + 1} ${a.words} by ${stepWords(a.direction)}` : `Move a corner ${a.words}: choose one first`}
          variant="secondary"
          size="compact"
          disabled={chosen === null}
          onPress={() => drawing.nudgeSelected(a.direction)}
          testID={`corner-move-${a.direction}`}
        />
      ))}
      <Text variant="label" tone="muted" accessibilityLiveRegion="polite" testID="corner-chosen">
        {chosen !== null ? `Corner ${chosen + 1} of ${n} chosen; a step is ${stepWords('up')} up or down, ${stepWords('left')} across` : 'No corner chosen'}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.sm },
  toolbar: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
