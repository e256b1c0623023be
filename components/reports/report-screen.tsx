/** The compliance report of one plan version: spec against results, per line and overall, the grid, cautions, sign-off. */
import { StyleSheet, View } from 'react-native';
import { reviewStateLabels } from '../../contracts/reviews';
import type { ComplianceReport } from '../../contracts/reports';
import { errorMessage } from '../api/api-error';
import { formatDayTime } from '../projects/format-date';
import { ReviewPanel } from '../reviews/review-panel';
import { reviewStateTones } from '../reviews/review-state';
import { RequirePermission } from '../team/require-permission';
import { space } from '../theme';
import { Badge, Banner, Card, Heading, List, Loading, Screen, Text, TextLink } from '../ui';
import { BulletList } from './bullet-list';
import { DownloadLink } from './download-link';
import { FigureGrid } from './figure-grid';
import { demFigures, formatRangeCm, overallFigures, specFigures } from './report-figures';
import { ReportLineCard } from './report-line-card';
import { ReportCoverageCard } from './report-coverage-card';
import { ReportAsFlownCard } from './report-as-flown-card';
import { SpecChecks } from './spec-checks';
import { useReportScreen } from './use-report-screen';

/** Route screen; planners, surveyors and owners read it (report:read), pilots read leg sheets instead. The review panel
 * sits under the sign-off block, so a surveyor signs off where the evidence is. */
export function ReportScreen() {
  const s = useReportScreen();
  const r = s.report.data;
  return (
    <Screen
      title="Compliance report"
      documentTitle={r ? `Compliance report — ${r.plan.name} v${r.version.number}` : 'Compliance report'}
      subtitle={r ? `${r.plan.name} · version ${r.version.number} · ${r.project.name} for ${r.project.client}` : undefined}
      testID="report-screen"
    >
      <TextLink href={s.versionHref} label="← Back to the version" testID="report-back" />
      <RequirePermission permission="report:read" what="The compliance report">
        {s.report.isPending ? <Loading label="Building the report…" /> : null}
        {s.report.isError ? <Banner tone="danger" title="Could not load the report" message={errorMessage(s.report.error)} testID="report-failure" /> : null}
        {r ? <ReportBody report={r} pdfHref={s.pdfHref} /> : null}
        {r && s.planId && s.versionId ? <ReviewPanel projectId={s.projectId} planId={s.planId} versionId={s.versionId} showReportLink={false} /> : null}
      </RequirePermission>
    </Screen>
  );
}

function ReportBody({ report: r, pdfHref }: { report: ComplianceReport; pdfHref: string | null }) {
  const passed = r.checks.filter((c) => c.pass).length;
  return (
    <>
      <View style={styles.topLine}>
        <Badge label={reviewStateLabels[r.version.reviewState]} tone={reviewStateTones[r.version.reviewState]} testID="report-state" />
        <Text tone="muted">
          Analysed {formatDayTime(r.version.analysedAt)}
          {r.version.createdBy ? ` · prepared by ${r.version.createdBy}` : ''}
        </Text>
      </View>
      {pdfHref ? <DownloadLink href={pdfHref} label="Download PDF" detail="The same report, printable, with sign-off block" testID="report-pdf" /> : null}

      <Card testID="report-spec">
        <Heading level={2}>Spec against results</Heading>
        <Text tone="muted" testID="report-checks-summary">
          {passed} of {r.checks.length} requirements met.
        </Text>
        <SpecChecks checks={r.checks} />
        <Heading level={3}>The client's spec</Heading>
        <FigureGrid figures={specFigures(r.spec)} testID="spec" />
      </Card>

      <ReportCoverageCard coverage={r.coverage} />
      <ReportAsFlownCard asFlown={r.asFlown} />

      <Card testID="report-overall">
        <Heading level={2}>All lines together</Heading>
        <FigureGrid figures={overallFigures(r.overall)} testID="overall" />
        <Text variant="label" tone="muted">
          Percentiles: {r.percentileMethod}
        </Text>
      </Card>

      <View style={styles.section}>
        <Heading level={2}>Line by line</Heading>
        {r.lines.map((line) => (
          <ReportLineCard key={line.number} line={line} bandCm={r.spec.gsdBandCm} targetCm={r.spec.targetGsdCm} />
        ))}
      </View>

      <Card testID="report-dem">
        <Heading level={2}>Elevation grid used</Heading>
        <FigureGrid figures={demFigures(r.dem)} testID="dem" />
      </Card>

      <Banner tone="info" title="Accuracy: advisory only" testID="report-accuracy">
        <Text>
          Horizontal {formatRangeCm(r.accuracy.horizontalCm)}, vertical {formatRangeCm(r.accuracy.verticalCm)}
          {r.accuracy.basisGsdCm !== null ? ` (median GSD ${r.accuracy.basisGsdCm.toFixed(2)} cm)` : ''}.
        </Text>
        <Text>{withSource(r.accuracy.ruleOfThumb, r.accuracy.source)}</Text>
        <Text variant="bodyStrong">{r.accuracy.deferral}</Text>
      </Banner>

      <Card testID="report-assumptions">
        <Heading level={2}>Assumptions</Heading>
        <BulletList items={r.assumptions} />
      </Card>

      {r.warnings.length ? (
        <Banner tone="caution" title="Warnings from the analysis" testID="report-warnings">
          <BulletList items={r.warnings} tone="caution" />
        </Banner>
      ) : null}

      <Banner tone="caution" title="Cautions" testID="report-cautions">
        <BulletList items={r.cautions} tone="caution" />
      </Banner>

      <Card testID="report-sign-off">
        <Heading level={2}>Sign-off</Heading>
        <FigureGrid
          figures={[
            { key: 'state', label: 'State', value: reviewStateLabels[r.signOff.state] },
            { key: 'by', label: 'Signed off by', value: r.signOff.signedOffBy ?? '–' },
            { key: 'at', label: 'Signed off on', value: formatDayTime(r.signOff.signedOffAt) },
            { key: 'version', label: 'Version', value: String(r.version.number) },
          ]}
          testID="sign-off"
        />
        <Text>{r.signOff.statement}</Text>
        {r.signOff.reasons.length ? (
          <View style={styles.reasons} testID="sign-off-reasons">
            <Text variant="bodyStrong" tone="caution">
              Signed off although these requirements are unmet — the surveyor's reasons:
            </Text>
            <List label="Reasons for unmet requirements">
              {r.signOff.reasons.map((x) => (
                <View key={x.key} testID={`sign-off-reason-${x.key}`}>
                  <Text variant="bodyStrong">
                    {x.label} (required {x.required}; achieved {x.achieved})
                  </Text>
                  <Text>{x.reason}</Text>
                </View>
              ))}
            </List>
          </View>
        ) : null}
        {r.flown ? (
          <View style={styles.reasons} testID="report-flown">
            <Text variant="bodyStrong" tone={r.flown.confirmedAt ? undefined : r.flown.required ? 'caution' : 'muted'}>{r.flown.statement}</Text>
            {r.flown.reasons.length ? (
              <List label="Reasons for confirming as flown despite lost ground">
                {r.flown.reasons.map((x) => (
                  <View key={x.key}>
                    <Text variant="bodyStrong">{x.label}</Text>
                    <Text>{x.reason}</Text>
                  </View>
                ))}
              </List>
            ) : null}
          </View>
        ) : null}
        <Text variant="label" tone="muted">
          Report generated {formatDayTime(r.generatedAt)}.
        </Text>
      </Card>
    </>
  );
}

/** The rule of thumb with its source named once, even when the server's sentence already names it. */
function withSource(rule: string, source: string): string {
  return rule.includes(source) ? rule : `${rule} (${source}).`;
}

const styles = StyleSheet.create({
  topLine: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  section: { gap: space.md },
  reasons: { gap: space.sm },
});
