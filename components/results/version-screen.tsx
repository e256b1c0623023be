/** One run of a plan: progress while the analysis runs, its reason when it failed, the results when done. */
import { useLocalSearchParams } from 'expo-router';
import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useMemo } from 'react';
import { MISSION_DEFAULTS } from '../../terrain/mission';
import { errorMessage } from '../api/api-error';
import { hillshadeGeoref } from '../map/image-georef';
import { analysisLabels } from '../plans/versions-list';
import { isSettled, planKeys, usePlan, useVersion, useVersionStatus } from '../plans/plans.queries';
import { useProject } from '../projects/projects.queries';
import { FlightCautions } from '../safety/flight-cautions';
import { ProgressBar } from '../sites/progress-bar';
import { useSite } from '../sites/sites.queries';
import { RequirePermission } from '../team/require-permission';
import { useCurrentTeam } from '../team/current-team-context';
import { Badge, Banner, Card, Loading, Screen, Text, TextLink } from '../ui';
import { ReviewPanel } from '../reviews/review-panel';
import { ResultsView } from './results-view';
import { AsFlownCard } from '../as-flown/as-flown-card';
import { SolvedCard } from './solved-card';
import { FlownConfirmationCard } from '../reviews/flown-confirmation-card';

type MissionSnapshot = { area?: { coordinates: number[][][] }; clearanceM?: number; obstacleAllowanceM?: number; maxAglM?: number };

/** Route /projects/:projectId/plans/:planId/versions/:versionId. */
export function VersionScreen() {
  const { projectId, planId, versionId } = useLocalSearchParams<{ projectId: string; planId: string; versionId: string }>();
  const { team } = useCurrentTeam();
  const project = useProject(team?.id, projectId);
  const plan = usePlan(team?.id, planId);
  const status = useVersionStatus(team?.id, planId, versionId);
  const st = status.data;
  const settled = isSettled(st);
  const version = useVersion(team?.id, planId, versionId, st?.analysisState === 'done');
  const queryClient = useQueryClient();
  // Lists that show this version's state (the plan page, the project page) catch up once it settles.
  useEffect(() => {
    if (!settled || !team) return;
    void queryClient.invalidateQueries({ queryKey: planKeys.versions(team.id, String(planId)), exact: true });
    void queryClient.invalidateQueries({ queryKey: planKeys.detail(team.id, String(planId)), exact: true });
    void queryClient.invalidateQueries({ queryKey: [...planKeys.team(team.id), 'list'] });
  }, [settled, team, planId, queryClient]);
  const site = useSite(team?.id, projectId, plan.data?.siteId);
  const v = version.data;
  const georef = useMemo(() => (site.data ? hillshadeGeoref(site.data.hillshade, site.data.metadata.crs.proj4) : null), [site.data]);
  const mission: MissionSnapshot = v?.input ?? plan.data?.input ?? {};
  const clearanceTotalM = (mission.clearanceM ?? 30) + (mission.obstacleAllowanceM ?? 0);
  return (
    <Screen
      title={plan.data ? `${plan.data.name}, version ${st?.number ?? '…'}` : 'Analysis'}
      subtitle={project.data?.name}
      documentTitle={plan.data ? `Results — ${plan.data.name} v${st?.number ?? '…'}` : 'Results'}
      width="full"
      testID="version-screen"
      actions={st ? <Badge label={analysisLabels[st.analysisState].label} tone={analysisLabels[st.analysisState].tone} testID="version-state" /> : null}
    >
      <TextLink href={`/projects/${projectId}/plans/${planId}`} label="← Back to the plan" />
      <RequirePermission permission="plan:read" what="Plans">
        <FlightCautions />
        {status.isPending || (st?.analysisState === 'done' && version.isPending) ? <Loading label="Loading the run…" /> : null}
        {status.isError ? <Banner tone="danger" title="Could not load this run" message={errorMessage(status.error)} /> : null}
        {version.isError ? <Banner tone="danger" title="Could not load the results" message={errorMessage(version.error)} /> : null}
        {st && !isSettled(st) ? (
          <Card testID="run-progress">
            <ProgressBar fraction={st.analysisProgressPct / 100} label={st.analysisState === 'queued' ? 'Waiting for a worker…' : 'Analysing over the terrain…'} testID="run-progress-bar" />
            {st.analysisError ? <Text variant="caption" tone="caution">The last attempt stopped: {st.analysisError} It is being tried again.</Text> : null}
            <Text variant="caption" tone="muted">
              The analysis runs on the server; you may leave this page and come back. This version is kept whatever happens.
            </Text>
          </Card>
        ) : null}
        {st?.analysisState === 'failed' ? (
          <Banner tone="danger" title="The analysis failed" message={st.analysisError ?? 'No reason was recorded.'} testID="run-failed" />
        ) : null}
        {v?.analysisState === 'done' && v.result && georef && site.data ? (
          <ResultsView
            result={v.result}
            source={{ teamId: team?.id, planId: String(planId), versionId: String(versionId) }}
            area={mission.area?.coordinates ?? null}
            georef={georef}
            hillshadeUrl={site.data.hillshadeUrl}
            units={project.data?.units ?? 'metric'}
            clearanceTotalM={clearanceTotalM}
            maxAglM={mission.maxAglM ?? MISSION_DEFAULTS.maxAglM}
            datum={site.data.verticalDatum}
            coverage={{ teamId: team?.id, planId: String(planId), versionId: String(versionId), hillshade: site.data.hillshade, signedOff: v.reviewState === 'signed_off' }}
          />
        ) : null}
        {v?.analysisState === 'done' && !v.result ? <Banner tone="danger" message="This version is marked done but carries no result." /> : null}
        {v?.analysisState === 'done' && v.result?.solved ? <SolvedCard solved={v.result.solved} plan={v.result.summary} /> : null}
        {v?.analysisState === 'done' && v.result ? (
          <AsFlownCard
            versionId={String(versionId)}
            offline={false}
            signedOff={v.reviewState === 'signed_off'}
            units={project.data?.units ?? 'metric'}
            origin={plan.data && st ? { projectId: String(projectId), siteId: v.siteId, planName: plan.data.name, versionNumber: st.number } : undefined}
          />
        ) : null}
        {st ? <ReviewPanel projectId={projectId} planId={planId} versionId={versionId} analysisDone={st.analysisState === 'done'} /> : null}
        {v?.reviewState === 'signed_off' ? <FlownConfirmationCard planId={String(planId)} versionId={String(versionId)} /> : null}
      </RequirePermission>
    </Screen>
  );
}
