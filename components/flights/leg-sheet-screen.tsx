/** The pilot's leg sheet, phone-first: lines in flying order with their legs, battery plan, checklist, exports. */
import { useLocalSearchParams } from 'expo-router';
import { StyleSheet, View } from 'react-native';
import type { LegSheet } from '../../contracts/flights';
import { errorMessage } from '../api/api-error';
import { formatDayTime } from '../projects/format-date';
import { formatLength, formatSpeed } from '../projects/units';
import { BulletList } from '../reports/bullet-list';
import { FigureGrid } from '../reports/figure-grid';
import { FlightCautions } from '../safety/flight-cautions';
import { RequirePermission } from '../team/require-permission';
import { space } from '../theme';
import { Badge, Banner, Card, Heading, Loading, Screen, Text, TextLink } from '../ui';
import { AsFlownCard } from '../as-flown/as-flown-card';
import { useAfterFirstPaint } from '../app/use-after-first-paint';
import { BatteryPlanCard } from './battery-plan-card';
import { ExportLinks } from './export-links';
import { formatLatLon } from './leg-format';
import { LineIndexCard } from './line-index-card';
import { LinesSketchCard } from './lines-sketch-card';
import { LiveCoverageCard } from './live-coverage-card';
import { MissionItemsCard } from './mission-items-card';
import { OfflineNotice } from './offline-notice';
import { PreflightChecklist } from './preflight-checklist';
import { sheetBlocks } from './sheet-blocks';
import { SheetLine } from './sheet-line';
import { SpotPhotosCard } from './spot-photos-card';
import { useLegSheet } from './use-leg-sheet';

/** Route /flights/:versionId. */
export function LegSheetScreen() {
  const { versionId } = useLocalSearchParams<{ versionId: string }>();
  const { source, teamId, retry, retrying } = useLegSheet(versionId);
  const sheet = source.kind === 'live' || source.kind === 'offline' ? source.sheet : null;
  return (
    <Screen
      title="Leg sheet"
      documentTitle={sheet ? `Leg sheet — ${sheet.version.planName} v${sheet.version.number}` : 'Leg sheet'}
      subtitle={sheet ? `${sheet.version.planName} · version ${sheet.version.number} · ${sheet.version.projectName}` : undefined}
      testID="leg-sheet-screen"
    >
      <TextLink href="/flights" label="← All flights" testID="leg-sheet-back" />
      <RequirePermission permission="flight:read" what="Leg sheets">
        {source.kind === 'offline' ? <OfflineNotice savedAt={source.savedAt} reason={source.reason} onRetry={retry} retrying={retrying} /> : null}
        {source.kind === 'loading' ? (
          <Loading label={source.waitingForConnection ? 'Waiting for a connection… (this sheet was never loaded on this device)' : 'Loading the leg sheet…'} />
        ) : null}
        {source.kind === 'error' ? <Banner tone="danger" title="Could not load the leg sheet" message={errorMessage(source.error)} testID="leg-sheet-failure" /> : null}
        {sheet ? <SheetBody sheet={sheet} teamId={teamId} offline={source.kind === 'offline'} /> : null}
      </RequirePermission>
    </Screen>
  );
}

function SheetBody({ sheet, teamId, offline }: { sheet: LegSheet; teamId: string | undefined; offline: boolean }) {
  const u = sheet.units;
  const firstLeg = sheet.lines[0]?.legs[0];
  // The first line is drawn with the top of the sheet; the other lines and the cards below them a moment later.
  const whole = useAfterFirstPaint();
  const lines = whole ? sheet.lines : sheet.lines.slice(0, 1);
  const tilted = sheet.lines.some((l) => (l.cameraTiltDeg ?? 0) > 0);
  const spots = sheet.lines.filter((l) => l.kind === 'spot').length;
  return (
    <View style={styles.body}>
      {sheet.version.signedOff ? (
        <View style={styles.signed}>
          <Badge label="Signed off" tone="success" testID="leg-sheet-state" />
          <Text>
            by {sheet.version.signedOffBy} on {formatDayTime(sheet.version.signedOffAt)}
          </Text>
        </View>
      ) : (
        <Banner tone="danger" title="Not signed off: do not fly from this sheet" testID="leg-sheet-not-signed" message="Only a signed-off version is meant for flight. This one is still with the planner and surveyor." />
      )}
      <FlightCautions />
      {/* The sheet runs to many screens; the index puts every line within one tap of the top. */}
      <LineIndexCard sheet={sheet} />
      <LinesSketchCard sheet={sheet} />
      {sheet.warnings.length ? (
        <Banner tone="caution" title="Warnings from the analysis" testID="leg-sheet-warnings">
          <BulletList items={sheet.warnings} tone="caution" />
        </Banner>
      ) : null}
      <Card testID="leg-sheet-datum">
        <Heading level={2}>Takeoff and heights</Heading>
        <Text>
          Altitudes above takeoff assume you take off at {formatLatLon(sheet.datum.takeoff)}, where the grid puts the ground at{' '}
          {formatLength(sheet.datum.takeoffGroundM, u, 1)} above {sheet.datum.name}. From another spot every altitude above takeoff shifts by the
          height difference.
        </Text>
        <FigureGrid
          testID="sheet-facts"
          figures={[
            { key: 'lines', label: 'Lines', value: String(sheet.lines.length - spots) },
            ...(spots ? [{ key: 'spots', label: 'Spot photos', value: String(spots) }] : []),
            { key: 'speed', label: 'Speed', value: formatSpeed(sheet.speedMps, u) },
            { key: 'mode', label: 'Altitude mode', value: sheet.altitudeMode },
            { key: 'first', label: 'First leg above takeoff', value: firstLeg ? formatLength(firstLeg.altitudeAboveTakeoffM.start, u) : '–' },
          ]}
        />
      </Card>
      <PreflightChecklist items={sheet.checklist} versionId={sheet.version.id} />
      <BatteryPlanCard plan={sheet.batteries} units={u} />
      <View style={styles.lines}>
        {sheetBlocks(lines).map((b) =>
          b.kind === 'line' ? (
            <SheetLine key={b.line.number} line={b.line} units={u} datumName={sheet.datum.name} />
          ) : (
            <SpotPhotosCard key={`spots-${b.spots[0]!.number}`} block={b} units={u} datumName={sheet.datum.name} tiltedLines={tilted} />
          ),
        )}
      </View>
      {whole ? <SheetFoot sheet={sheet} teamId={teamId} offline={offline} /> : null}
    </View>
  );
}

/** Everything below the lines: the autopilot's items, live and as-flown coverage, exports and the sheet's time. */
function SheetFoot({ sheet, teamId, offline }: { sheet: LegSheet; teamId: string | undefined; offline: boolean }) {
  const u = sheet.units;
  return (
    <>
      <MissionItemsCard teamId={teamId} versionId={sheet.version.id} signedOff={sheet.version.signedOff} offline={offline} units={u} />
      <LiveCoverageCard teamId={teamId} versionId={sheet.version.id} signedOff={sheet.version.signedOff} offline={offline} units={u} />
      <AsFlownCard versionId={sheet.version.id} offline={offline} signedOff={sheet.version.signedOff} units={u} />
      {teamId ? <ExportLinks teamId={teamId} planId={sheet.version.planId} versionId={sheet.version.id} offline={offline} /> : null}
      <Text variant="label" tone="muted">
        Sheet generated {formatDayTime(sheet.generatedAt)}. Heights in {u === 'imperial' ? 'feet' : 'metres'}.
      </Text>
    </>
  );
}

const styles = StyleSheet.create({
  body: { gap: space.xl },
  signed: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  lines: { gap: space.lg },
});
