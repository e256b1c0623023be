/** Download links for a version's open-format exports: GeoJSON, KML, GPX and CSV. */
import { StyleSheet, View } from 'react-native';
import { exportFormats, exportMedia, type ExportFormat } from '../../contracts/exports';
import { DownloadLink } from '../reports/download-link';
import { space } from '../theme';
import { Card, Heading, Text } from '../ui';
import { exportPath } from './flights.queries';

const formatNames: Record<ExportFormat, string> = { geojson: 'GeoJSON', kml: 'KML', gpx: 'GPX', csv: 'CSV' };

/** testIDs export-geojson, export-kml, export-gpx, export-csv. */
export function ExportLinks({ teamId, planId, versionId, offline }: { teamId: string; planId: string; versionId: string; offline: boolean }) {
  return (
    <Card testID="export-links">
      <Heading level={2}>Exports</Heading>
      <Text tone="muted">
        Open formats with every altitude's datum named in the file. Check them in your own software before you fly from them.
        {offline ? ' Downloads need the connection back.' : ''}
      </Text>
      <View style={styles.links}>
        {exportFormats.map((f) => (
          <DownloadLink key={f} href={exportPath(teamId, planId, versionId, f)} label={`Download ${formatNames[f]}`} detail={exportMedia[f].label} testID={`export-${f}`} />
        ))}
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({ links: { gap: space.sm } });
