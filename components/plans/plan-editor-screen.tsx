/** Routes /projects/:projectId/plans/new (?siteId=) and /projects/:projectId/plans/:planId: load, then the editor. */
import { useLocalSearchParams, useRouter } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import { errorMessage } from '../api/api-error';
import { useProject } from '../projects/projects.queries';
import { useSite, useSites } from '../sites/sites.queries';
import { RequirePermission } from '../team/require-permission';
import { useCurrentTeam } from '../team/current-team-context';
import { space } from '../theme';
import { Banner, Button, Card, EmptyState, Heading, Loading, Screen, TextLink } from '../ui';
import { PlanEditor } from './plan-editor';
import { usePlan, useVersions } from './plans.queries';
import { VersionsList } from './versions-list';

/** A new plan: the site comes from ?siteId=, or the planner picks one of the project's grids. */
export function NewPlanScreen() {
  const { projectId, siteId } = useLocalSearchParams<{ projectId: string; siteId?: string }>();
  const { team } = useCurrentTeam();
  const router = useRouter();
  const project = useProject(team?.id, projectId);
  const sites = useSites(team?.id, projectId);
  const site = useSite(team?.id, projectId, siteId);
  return (
    <Screen title="New plan" subtitle={project.data?.name} width="full" testID="new-plan-screen">
      <TextLink href={`/projects/${projectId}`} label="← Back to the project" />
      <RequirePermission permission="plan:write" what="Creating plans">
        {project.isError ? <Banner tone="danger" message={errorMessage(project.error)} /> : null}
        {!siteId ? (
          sites.data && sites.data.length === 0 ? (
            <EmptyState title="Upload an elevation grid first" message="A plan is made over one of the project's elevation grids." action={<Button label="Upload an elevation grid" onPress={() => router.push(`/projects/${projectId}/sites/new`)} />} />
          ) : (
            <Card>
              <Heading level={2}>Which elevation grid?</Heading>
              <View style={styles.choices}>
                {(sites.data ?? []).map((s) => (
                  <Button key={s.id} label={s.name} variant="secondary" onPress={() => router.setParams({ siteId: s.id })} testID={`plan-site-${s.name}`} />
                ))}
              </View>
            </Card>
          )
        ) : null}
        {siteId && (site.isPending || project.isPending) ? <Loading label="Loading the elevation grid…" /> : null}
        {site.isError ? <Banner tone="danger" title="Could not load the grid" message={errorMessage(site.error)} /> : null}
        {site.data && project.data ? <PlanEditor key={site.data.id} project={project.data} site={site.data} plan={null} /> : null}
      </RequirePermission>
    </Screen>
  );
}

/** A saved plan: its versions, then the editor (read-only for roles without plan:write). */
export function PlanScreen() {
  const { projectId, planId } = useLocalSearchParams<{ projectId: string; planId: string }>();
  const { team } = useCurrentTeam();
  const project = useProject(team?.id, projectId);
  const plan = usePlan(team?.id, planId);
  const site = useSite(team?.id, projectId, plan.data?.siteId);
  const versions = useVersions(team?.id, planId);
  return (
    <Screen width="full" title={plan.data?.name ?? 'Plan'} subtitle={project.data ? `In ${project.data.name}${site.data ? ` · over ${site.data.name}` : ''}` : undefined} testID="plan-screen">
      <TextLink href={`/projects/${projectId}`} label="← Back to the project" />
      <RequirePermission permission="plan:read" what="Plans">
        {plan.isPending ? <Loading label="Loading the plan…" /> : null}
        {plan.isError ? <Banner tone="danger" title="Could not load the plan" message={errorMessage(plan.error)} /> : null}
        {versions.data ? (
          <Card>
            <Heading level={2}>Versions</Heading>
            <VersionsList projectId={String(projectId)} versions={versions.data} />
          </Card>
        ) : null}
        {plan.data && site.data && project.data ? <PlanEditor key={plan.data.id} project={project.data} site={site.data} plan={plan.data} /> : null}
      </RequirePermission>
    </Screen>
  );
}

const styles = StyleSheet.create({ choices: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm } });
