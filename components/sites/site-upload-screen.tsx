/** Upload an elevation grid to a project: the file, its name, surface kind and vertical datum; progress; the refusal as-is. */
import { useLocalSearchParams } from 'expo-router';
import { Controller } from 'react-hook-form';
import { StyleSheet, View } from 'react-native';
import { RequirePermission } from '../team/require-permission';
import { space } from '../theme';
import { Banner, Button, Card, ChoiceGroup, Screen, Text, TextField, TextLink } from '../ui';
import { FilePicker } from './file-picker';
import { formatBytes } from '../../contracts/format/bytes';
import { ProgressBar } from './progress-bar';
import { surfaceKindInfo, surfaceKinds, type SurfaceKind } from './site-shape';
import { datumFromFile, datumPresets, geotiffAccept, useSiteUpload } from './use-site-upload';

const kindChoices = surfaceKinds.map((k) => ({ value: k, label: surfaceKindInfo[k].label }));
const otherDatum = 'other';

/** Route /projects/:projectId/sites/new (site:write). */
export function SiteUploadScreen() {
  const { projectId } = useLocalSearchParams<{ projectId: string }>();
  const s = useSiteUpload(String(projectId));
  const { control } = s.form;
  return (
    <Screen title="Upload an elevation grid" subtitle="A GeoTIFF DEM of the survey site; Loftline reads it and draws a hillshade." width="form" testID="site-upload-screen">
      <TextLink href={`/projects/${projectId}`} label="← Back to the project" />
      <RequirePermission permission="site:write" what="Uploading elevation grids">
        <Card>
          <View style={styles.field}>
            <Text variant="label">GeoTIFF file</Text>
            <View style={styles.fileRow}>
              <FilePicker label={s.file ? 'Choose another file' : 'Choose a GeoTIFF…'} accept={geotiffAccept} onPick={s.pick} disabled={s.busy} testID="site-file" />
              {s.file ? (
                <Text testID="site-file-name">
                  {s.file.name} · {formatBytes(s.file.size)}
                </Text>
              ) : (
                <Text tone="muted">No file chosen</Text>
              )}
            </View>
            {s.fileError ? (
              <Text variant="caption" tone="danger" testID="site-file-error">
                {s.fileError}
              </Text>
            ) : null}
          </View>
          <Controller
            control={control}
            name="name"
            render={({ field, fieldState }) => (
              <TextField label="Name" hint="How the grid is listed in the project." value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={fieldState.error?.message} testID="site-name" />
            )}
          />
          <Controller
            control={control}
            name="surfaceKind"
            render={({ field, fieldState }) => (
              <View style={styles.field}>
                <Text variant="label">What the heights describe</Text>
                <Text variant="caption" tone="muted">
                  You state it: the file does not say. {field.value ? surfaceKindInfo[field.value as SurfaceKind].hint : ''}
                </Text>
                <ChoiceGroup label="Surface kind" choices={kindChoices} value={field.value} onChange={field.onChange} testID="site-surface" />
                {fieldState.error ? (
                  <Text variant="caption" tone="danger" testID="site-surface-error">
                    {fieldState.error.message}
                  </Text>
                ) : null}
              </View>
            )}
          />
          <Controller
            control={control}
            name="verticalDatum"
            render={({ field, fieldState }) => {
              const preset = [...datumPresets, datumFromFile].includes(field.value as never) ? field.value : otherDatum;
              return (
                <View style={styles.field}>
                  <Text variant="label">Vertical datum of the heights</Text>
                  <ChoiceGroup
                    label="Vertical datum"
                    choices={[...datumPresets.map((d) => ({ value: d as string, label: d })), { value: datumFromFile, label: 'As the file declares' }, { value: otherDatum, label: 'Other…' }]}
                    value={preset}
                    onChange={(v) => field.onChange(v === otherDatum ? '' : v)}
                    testID="site-datum"
                  />
                  {preset === otherDatum ? (
                    <TextField label="Datum name" hint="E.g. a national height datum and its EPSG code." value={field.value} onChangeText={field.onChange} onBlur={field.onBlur} error={fieldState.error?.message} testID="site-datum-other" />
                  ) : null}
                </View>
              );
            }}
          />
          {s.progress ? <ProgressBar fraction={s.progress.fraction} label={`Uploading ${s.file?.name ?? 'the grid'}`} testID="site-upload-progress" /> : null}
          {s.busy && s.progress && s.progress.fraction >= 1 ? <Text tone="muted">Reading the grid and drawing the hillshade…</Text> : null}
          {s.refusal ? (
            <Banner tone="danger" title="The grid was not accepted" message={s.refusal} testID="site-upload-refused">
              {s.duplicateOf ? <TextLink href={`/projects/${projectId}/sites/${s.duplicateOf}`} label="Open the grid already uploaded" testID="site-duplicate-link" /> : null}
            </Banner>
          ) : null}
          <Button label="Upload" onPress={() => void s.submit()} busy={s.busy} testID="site-upload-submit" />
        </Card>
      </RequirePermission>
    </Screen>
  );
}

const styles = StyleSheet.create({
  field: { gap: space.xs },
  fileRow: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.md },
});
