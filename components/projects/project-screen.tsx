/** One project: its details, its elevation grids and its plans, with the actions each role may take. */
import { useLocalSearchParams, useRouter } from 'expo-router';
import { useState, type ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';
import { can } from '../../contracts/roles';
import { errorMessage } from '../api/api-error';
import { reviewStateLabels } from '../../contracts/reviews';
import { analysisLabels } from '../plans/versions-list';
import { reviewStateTones } from '../reviews/review-state';
import { usePlans } from '../plans/plans.queries';
import { horizontalUnitOf } from '../sites/site-facts';
import { surfaceKindInfo } from '../sites/site-shape';
import { useSites } from '../sites/sites.queries';
import { RequirePermission } from '../team/require-permission';
import { useCurrentTeam } from '../team/current-team-context';
import { colors, layout, space } from '../theme';
import { Badge, Banner, Button, Card, Heading, LinkPressable, List, Loading, Screen, Text, TextLink } from '../ui';
import { formatDay } from './format-date';
import { ProjectForm } from './project-form';
import { useProject, useUpdateProject } from './projects.queries';

function ListLink({ href, title, detail, badges, testID, last }: { href: string; title: string; detail: string; badges?: ReactNode; testID: string; last: boolean }) {
  return (
    <LinkPressable href={href} testID={testID} style={(s) => [styles.item, !last && styles.divider, (s.hovered || s.pressed) && styles.hover, s.focused && styles.focused]}>
      <View style={styles.itemTitle}>
        <Text variant="bodyStrong" tone="primary">{title}</Text>
        {badges}
      </View>
      <Text variant="caption" tone="muted">{detail}</Text>
    </LinkPressable>
  );
}

/** Route /projects/:projectId. */
export function ProjectScreen() {
  const { projectId } = useLocalSearchParams<{ projectId: string }>();
  const { team, role } = useCurrentTeam();
  const router = useRouter();
  const project = useProject(team?.id, projectId);
  const sites = useSites(team?.id, projectId);
  const plans = usePlans(team?.id, projectId);
  const update = useUpdateProject(team?.id ?? '');
  const [editing, setEditing] = useState(false);
  const p = project.data;
  const siteName = (id: string) => sites.data?.find((s) => s.id === id)?.name ?? 'an elevation grid';
  return (
    <Screen
      title={p?.name ?? 'Project'}
      subtitle={p ? [p.client || 'No client named', p.units === 'imperial' ? 'imperial units (ft)' : 'metric units'].join(' · ') : undefined}
      testID="project-screen"
      actions={p && can(role, 'project:write') && !editing ? <Button label="Edit details" variant="secondary" onPress={() => setEditing(true)} testID="project-edit" /> : null}
    >
      <TextLink href="/projects" label="← All projects" />
      <RequirePermission permission="project:read" what="Projects">
        {project.isPending ? <Loading label="Loading the project…" /> : null}
        {project.isError ? <Banner tone="danger" title="Could not load the project" message={errorMessage(project.error)} /> : null}
        {p?.archivedAt ? <Banner tone="info" message={`Archived on ${formatDay(p.archivedAt)}. Restore it from the projects list to work on it again.`} testID="project-archived-banner" /> : null}
        {p && editing ? (
          <Card>
            <Heading level={2}>Project details</Heading>
            <ProjectForm
              testID="project-details-form"
              initial={p}
              submitLabel="Save"
              onCancel={() => setEditing(false)}
              onSubmit={async (values) => {
                await update.mutateAsync({ projectId: p.id, change: values });
                setEditing(false);
              }}
            />
          </Card>
        ) : null}
        {p?.notes && !editing ? (
          <Card>
            <Text>{p.notes}</Text>
          </Card>
        ) : null}
        {p ? (
          <>
            <Card testID="project-sites">
              <View style={styles.head}>
                <Heading level={2}>Elevation grids</Heading>
                {can(role, 'site:write') ? <Button label="Upload an elevation grid" size="compact" onPress={() => router.push(`/projects/${p.id}/sites/new`)} testID="site-upload-open" /> : null}
              </View>
              {sites.isPending ? <Loading label="Loading the grids…" /> : null}
              {sites.isError ? <Banner tone="danger" message={errorMessage(sites.error)} /> : null}
              {sites.data?.length === 0 ? <Text tone="muted">No elevation grid yet. Plans are made over an uploaded GeoTIFF DEM.</Text> : null}
              <List label="Elevation grids">
                {(sites.data ?? []).map((s, i) => (
                  <ListLink
                    key={s.id}
                    href={`/projects/${p.id}/sites/${s.id}`}
                    title={s.name}
                    detail={`${s.metadata.crs.name} · ${Number(s.metadata.resolution[0].toPrecision(4))} ${horizontalUnitOf(s.metadata.crs.proj4)} pixels · heights above ${s.verticalDatum} · ${formatDay(s.createdAt)}`}
                    badges={<Badge label={surfaceKindInfo[s.surfaceKind].label} tone={s.surfaceKind === 'bare-earth' ? 'caution' : 'info'} />}
                    testID={`site-link-${s.name}`}
                    last={i === (sites.data?.length ?? 0) - 1}
                  />
                ))}
              </List>
            </Card>
            <Card testID="project-plans">
              <View style={styles.head}>
                <Heading level={2}>Plans</Heading>
                {can(role, 'plan:write') ? (
                  <Button label="New plan" size="compact" disabled={!sites.data?.length} onPress={() => router.push(`/projects/${p.id}/plans/new${sites.data?.length === 1 ? `?siteId=${sites.data[0].id}` : ''}`)} testID="plan-new-open" />
                ) : null}
              </View>
              {plans.isError ? <Banner tone="danger" message={errorMessage(plans.error)} /> : null}
              {plans.data?.length === 0 ? <Text tone="muted">No plans yet.</Text> : null}
              <List label="Plans">
                {(plans.data ?? []).map((pl, i) => (
                  <ListLink
                    key={pl.id}
                    href={`/projects/${p.id}/plans/${pl.id}`}
                    title={pl.name}
                    detail={`Over ${siteName(pl.siteId)} · updated ${formatDay(pl.updatedAt)}`}
                    badges={
                      pl.latestVersion ? (
                        // The review state beside the analysis state, so a surveyor sees the work waiting without opening each plan.
                        <>
                          <Badge label={`v${pl.latestVersion.number} ${analysisLabels[pl.latestVersion.analysisState].label.toLowerCase()}`} tone={analysisLabels[pl.latestVersion.analysisState].tone} />
                          <Badge label={reviewStateLabels[pl.latestVersion.reviewState]} tone={reviewStateTones[pl.latestVersion.reviewState]} testID={`plan-review-${pl.name}`} />
                        </>
                      ) : (
                        <Badge label="Not run yet" />
                      )
                    }
                    testID={`plan-link-${pl.name}`}
                    last={i === (plans.data?.length ?? 0) - 1}
                  />
                ))}
              </List>
            </Card>
          </>
        ) : null}
      </RequirePermission>
    </Screen>
  );
}

const styles = StyleSheet.create({
  head: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', justifyContent: 'space-between', gap: space.sm },
  item: { gap: space.xxs, paddingVertical: space.sm },
  itemTitle: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  divider: { borderBottomWidth: layout.borderWidthPx, borderBottomColor: colors.line },
  hover: { backgroundColor: colors.surfaceSunken },
  focused: { outlineColor: colors.focus, outlineWidth: layout.focusRingPx, outlineStyle: 'solid' },
});
