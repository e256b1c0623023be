/** One elevation grid: its metadata table and hillshade preview; planners start a plan over it from here. */
import { useLocalSearchParams, useRouter } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { can } from '../../contracts/roles';
import { errorMessage } from '../api/api-error';
import { useBreakpoint } from '../layout/use-breakpoint';
import { useMemo } from 'react';
import { hillshadeGeoref } from '../map/image-georef';
import { MapCanvas } from '../map/map-canvas';
import { useProject } from '../projects/projects.queries';
import { RequirePermission } from '../team/require-permission';
import { useCurrentTeam } from '../team/current-team-context';
import { space } from '../theme';
import { Badge, Banner, Button, Card, Heading, Loading, Screen, Text, TextLink } from '../ui';
import { siteFacts } from './site-facts';
import { SiteMetadataTable } from './site-metadata-table';
import { surfaceKindInfo } from './site-shape';
import { useSite } from './sites.queries';

/** Route /projects/:projectId/sites/:siteId. */
export function SiteScreen() {
  const { projectId, siteId } = useLocalSearchParams<{ projectId: string; siteId: string }>();
  const { team, role } = useCurrentTeam();
  const router = useRouter();
  const project = useProject(team?.id, projectId);
  const site = useSite(team?.id, projectId, siteId);
  const s = site.data;
  const georef = useMemo(() => (s ? hillshadeGeoref(s.hillshade, s.metadata.crs.proj4) : null), [s]);
  const wide = useBreakpoint() === 'wide';
  return (
    <Screen
      title={s ? s.name : 'Elevation grid'}
      subtitle={project.data ? `In ${project.data.name}` : undefined}
      testID="site-screen"
      actions={
        s && can(role, 'plan:write') ? (
          <Button label="Plan a flight over this grid" onPress={() => router.push(`/projects/${projectId}/plans/new?siteId=${s.id}`)} testID="site-new-plan" />
        ) : null
      }
    >
      <TextLink href={`/projects/${projectId}`} label="← Back to the project" />
      <RequirePermission permission="site:read" what="Elevation grids">
        {site.isPending ? <Loading label="Loading the grid…" /> : null}
        {site.isError ? <Banner tone="danger" title="Could not load the grid" message={errorMessage(site.error)} /> : null}
        {s && team ? (
          <View style={[styles.body, wide && styles.sideBySide]}>
            <Card style={wide ? styles.half : undefined}>
              <View style={styles.headRow}>
                <Heading level={2}>Hillshade</Heading>
                <Badge label={surfaceKindInfo[s.surfaceKind].label} tone={s.surfaceKind === 'bare-earth' ? 'caution' : 'info'} testID="site-surface-badge" />
              </View>
              <MapCanvas
                imageUrl={s.hillshadeUrl}
                widthPx={s.hillshade.width}
                heightPx={s.hillshade.height}
                shapes={[]}
                georef={georef ?? undefined}
                label={`Hillshade preview of ${s.name}, lit from the north-west.`}
                testID="site-hillshade"
              />
              <Text variant="caption" tone="muted">
                Lit from the north-west; hatched where the grid has no data. {surfaceKindInfo[s.surfaceKind].hint}
              </Text>
            </Card>
            <Card style={wide ? styles.half : undefined}>
              <Heading level={2}>What Loftline read from the file</Heading>
              <SiteMetadataTable facts={siteFacts(s, project.data?.units ?? 'metric')} />
            </Card>
          </View>
        ) : null}
      </RequirePermission>
    </Screen>
  );
}

const styles = StyleSheet.create({
  body: { gap: space.xl },
  sideBySide: { flexDirection: 'row', alignItems: 'flex-start' },
  half: { flex: 1, minWidth: 0 },
  headRow: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', justifyContent: 'space-between', gap: space.sm },
});
