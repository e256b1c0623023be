/** The plan editor: map (area and takeoff) beside the mission form on wide screens, above it on phones. */
import { Controller } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import type { Project } from '../../contracts/projects';
import { useBreakpoint } from '../layout/use-breakpoint';
import { AreaDrawingMap } from '../map/area-drawing-map';
import { FlightCautions } from '../safety/flight-cautions';
import type { Site } from '../sites/site-shape';
import { space } from '../theme';
import { Banner, Button, Card, Heading, Text, TextField } from '../ui';
import { CameraFields } from './camera-fields';
import { DerivedPanel } from './derived-panel';
import { AircraftFields, AltitudeFields, MoreFields, TargetFields } from './mission-fields';
import { SpecFields } from './spec-fields';
import type { Plan } from './plan-shape';
import { usePlanEditor } from './use-plan-editor';

export function PlanEditor({ project, site, plan }: { project: Project; site: Site; plan: Plan | null }) {
  const e = usePlanEditor({ project, site, plan });
  const wide = useBreakpoint() === 'wide';
  const readOnly = !e.mayWrite;
  const fieldProps = { control: e.form.control, setValue: e.form.setValue, readOnly, units: e.units };
  const invalid = Object.keys(e.form.formState.errors).length > 0;

  const map = (
    <Card testID="plan-map-card">
      <Heading level={2}>Survey area and takeoff</Heading>
      <AreaDrawingMap
        drawing={e.drawing}
        georef={e.georef}
        imageUrl={site.hillshadeUrl}
        widthPx={site.hillshade.width}
        heightPx={site.hillshade.height}
        editable={e.mayWrite}
        fieldError={e.areaError}
      />
    </Card>
  );
  const actions = (
    <View style={styles.actions}>
      {invalid ? <Banner tone="danger" message="Some values need attention: see the messages beside the fields." testID="plan-form-invalid" /> : null}
      {e.refusal ? <Banner tone="danger" title="The plan was not accepted" message={e.refusal} testID="plan-refused" /> : null}
      <View style={styles.buttons}>
        {e.mayWrite ? <Button label={plan ? 'Save changes' : 'Save plan'} variant="secondary" busy={e.busy === 'save'} disabled={e.busy !== null} onPress={() => void e.save()} testID="plan-save" /> : null}
        {e.mayRun ? <Button label="Run analysis" busy={e.busy === 'run'} disabled={e.busy !== null} onPress={() => void e.run()} testID="plan-run" /> : null}
      </View>
      {e.mayRun ? (
        <Text variant="caption" tone="muted">
          Running saves the plan and makes a new, unchangeable version with its analysis.
        </Text>
      ) : null}
    </View>
  );
  const formColumn = (
    <View style={styles.column}>
      <Card>
        <Controller
          control={e.form.control}
          name="name"
          render={({ field, fieldState }) => (
            <TextField label="Plan name" value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={fieldState.error?.message} editable={!readOnly} testID="plan-name" />
          )}
        />
        <Text variant="caption" tone="muted">
          Over {site.name} ({site.metadata.crs.name}, heights above {site.verticalDatum}).
        </Text>
      </Card>
      <CameraFields control={e.form.control} setValue={e.form.setValue} readOnly={readOnly} />
      <TargetFields {...fieldProps} />
      <DerivedPanel control={e.form.control} units={e.units} />
      <SpecFields {...fieldProps} />
      <AltitudeFields {...fieldProps} />
      <AircraftFields {...fieldProps} />
      <MoreFields {...fieldProps} />
      {actions}
    </View>
  );
  return (
    <View style={styles.body}>
      <FlightCautions compact={!wide} />
      {readOnly ? <Banner tone="info" message="You are reading this plan: planners and owners change it and run its analysis." testID="plan-read-only" /> : null}
      {wide ? (
        <View style={styles.row}>
          <View style={styles.mapColumn}>{map}</View>
          <View style={styles.formColumn}>{formColumn}</View>
        </View>
      ) : (
        <>
          {map}
          {formColumn}
        </>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  body: { gap: space.xl },
  row: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  // The map stays in view while the form scrolls past it (position sticky is a web-only value).
  mapColumn: { flex: 6, minWidth: 0, position: 'sticky' as never, top: 0 },
  formColumn: { flex: 5, minWidth: 0 },
  column: { gap: space.xl },
  actions: { gap: space.sm },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
