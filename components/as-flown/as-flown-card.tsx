/**
 * Photos as flown: pick the flight's photos (their metadata is read on this device; the photos never leave it) or
 * its CSV photo log, and see what the photos really covered against the spec and the plan: missed triggers, lines
 * off track, ground lost against the plan, and the re-flight that mends it. Earlier checks stay listed.
 */
import { StyleSheet, View } from 'react-native';
import type { AsFlownCheck } from '../../contracts/as-flown';
import { areaWords, itemTitle, shareWords } from '../../contracts/coverage-words';
import { PHOTO_LOG_COLUMNS } from '../../contracts/photo-log';
import { formatDay, formatDayTime } from '../projects/format-date';
import { formatDuration } from '../projects/units';
import { BulletList } from '../reports/bullet-list';
import { FigureGrid } from '../reports/figure-grid';
import { FilePicker } from '../sites/file-picker';
import { space } from '../theme';
import { Badge, Banner, Button, Card, Heading, Loading, Text, TextLink } from '../ui';
import { missedRuns, offTrackLines } from '../../contracts/as-flown-words';
import { useAsFlownCheck, type AsFlownCardState } from './use-as-flown-check';
import { useReflightPlans, type ReflightOrigin } from './use-reflight-plans';
import { ReflightStretches } from './reflight-stretches';
import { AsFlownMap } from './as-flown-map';
import type { UnitSystem } from '../../contracts/projects';

/** testIDs as-flown, as-flown-photos(-input), as-flown-csv(-input), as-flown-progress, as-flown-result, as-flown-check-N. */
export function AsFlownCard(p: { versionId: string; offline: boolean; origin?: ReflightOrigin; signedOff?: boolean | null; units?: UnitSystem }) {
  const s = useAsFlownCheck(p.versionId, { offline: p.offline });
  const reflight = useReflightPlans(p.origin);
  const busy = s.phase.kind === 'reading' || s.phase.kind === 'sending';
  return (
    <Card testID="as-flown">
      <Heading level={2}>Photos as flown</Heading>
      <Text tone="muted">
        Check what the photos really covered before you leave the site. Only each photo&apos;s position, altitude, attitude and time are read, here on this
        device; the photos themselves are not uploaded.
      </Text>
      {s.offline ? <Text tone="muted">Checking photos needs the connection back.</Text> : null}
      {s.mayCheck && !s.offline ? (
        <View style={styles.actions}>
          <FilePicker label="Check the flight's photos…" accept=".jpg,.jpeg,.tif,.tiff,image/jpeg,image/tiff" multiple onPick={() => {}} onPickMany={s.pick} disabled={busy} variant="primary" testID="as-flown-photos" />
          <FilePicker label="Check a CSV photo log…" accept=".csv,text/csv" onPick={(f) => s.pick([f])} disabled={busy} testID="as-flown-csv" />
        </View>
      ) : null}
      {s.mayCheck ? (
        <Text variant="label" tone="muted">
          CSV photo log: header {PHOTO_LOG_COLUMNS.join(',')}; altitudeRef is ellipsoid, datum or takeoff; empty attitude means looking straight down.
        </Text>
      ) : null}
      <Progress state={s} />
      {s.readNotes.length ? (
        <Banner tone="caution" title="Read with notes" testID="as-flown-read-notes">
          <BulletList items={s.readNotes.slice(0, 8).concat(s.readNotes.length > 8 ? [`and ${s.readNotes.length - 8} more`] : [])} tone="caution" />
        </Banner>
      ) : null}
      {s.listError ? <Banner tone="danger" title="Could not load the checks" message={s.listError} /> : null}
      {s.checks && s.checks.length === 0 && !busy ? <Text testID="as-flown-none">No photos checked for this version yet.</Text> : null}
      {s.shownLoading ? <Loading label="Loading the check…" /> : null}
      {s.shown ? <CheckResult check={s.shown} reflight={reflight} signedOff={p.signedOff ?? null} units={p.units ?? 'metric'} /> : null}
      {s.checks && s.checks.length > 1 ? (
        <View style={styles.history}>
          <Heading level={3}>Earlier checks</Heading>
          {s.checks.map((c, i) => (
            <Button
              key={c.id}
              size="compact"
              variant={c.id === s.selectedId ? 'primary' : 'secondary'}
              label={`${formatDayTime(c.createdAt)} · ${c.photoCount} photos · ${shareWords(c.shareAllFlown)} meets the spec`}
              accessibilityLabel={`Check of ${formatDayTime(c.createdAt)} by ${c.createdBy?.name ?? 'a former member'}: ${c.photoCount} photos, ${shareWords(c.shareAllFlown)} of the area meets the spec${c.id === s.selectedId ? ' (shown)' : ''}`}
              onPress={() => s.select(c.id)}
              testID={`as-flown-check-${s.checks!.length - i}`}
            />
          ))}
        </View>
      ) : null}
    </Card>
  );
}

function Progress({ state: s }: { state: AsFlownCardState }) {
  if (s.phase.kind === 'reading') return <View testID="as-flown-progress"><Loading label={`Reading the photos on this device… ${s.phase.done} of ${s.phase.total}`} /></View>;
  if (s.phase.kind === 'sending') return <View testID="as-flown-progress"><Loading label={`Checking ${s.phase.count} photos against the plan…`} /></View>;
  if (s.phase.kind === 'failed') return <Banner tone="danger" title="The photos could not be checked" message={s.phase.message} testID="as-flown-failure" />;
  return null;
}

function CheckResult({ check, reflight, signedOff, units }: { check: AsFlownCheck; reflight: ReturnType<typeof useReflightPlans>; signedOff: boolean | null; units: UnitSystem }) {
  const d = check.document;
  const runs = missedRuns(d.matching.missed);
  const off = offTrackLines(d.matching.lines);
  const meets = d.flown.shareAll >= d.planned.shareAll - 1e-9;
  const rf = d.reflight;
  return (
    <View style={styles.result} testID="as-flown-result">
      <Text variant="label" tone="muted">
        {check.label} · {check.photoCount} photos · checked by {check.createdBy?.name ?? 'a former member'} on {formatDayTime(check.createdAt)}
      </Text>
      <View style={styles.headline}>
        <Badge label={meets ? 'As planned' : 'Short of the plan'} tone={meets ? 'success' : 'danger'} testID="as-flown-verdict" />
        <Text variant="bodyStrong" testID="as-flown-share">
          Whole spec met on {shareWords(d.flown.shareAll)} of the area as flown ({shareWords(d.planned.shareAll)} as planned).
        </Text>
      </View>
      <FigureGrid
        testID="as-flown-items"
        figures={d.flown.items.map((it) => {
          const planned = d.planned.items.find((x) => x.item === it.item);
          return { key: it.item, label: itemTitle(it.item, d.spec), value: `${shareWords(it.share)} flown · ${planned ? shareWords(planned.share) : '–'} planned` };
        })}
      />
      <FigureGrid
        testID="as-flown-matching"
        figures={[
          { key: 'matched', label: 'Photos on planned stations', value: String(d.matching.matched) },
          { key: 'missed', label: 'Missed triggers', value: String(d.matching.missed.length) },
          { key: 'extra', label: 'Extra photos', value: String(d.matching.extra.length) },
          { key: 'lost', label: 'Ground lost against the plan', value: areaWords(d.difference.lostAreaM2) },
        ]}
      />
      {runs.length ? (
        <Banner tone="danger" title="Missed triggers" testID="as-flown-missed">
          <BulletList items={runs.slice(0, 12).concat(runs.length > 12 ? [`and ${runs.length - 12} more runs`] : [])} tone="danger" />
        </Banner>
      ) : null}
      {off.length ? (
        <Banner tone="caution" title={`Flown off track (more than ${d.matching.limits.offTrackM} m across the line)`} testID="as-flown-off-track">
          <BulletList items={off} tone="caution" />
        </Banner>
      ) : null}
      {d.matching.camera.messages.length ? <Banner tone="caution" title="Camera" testID="as-flown-camera"><BulletList items={d.matching.camera.messages} tone="caution" /></Banner> : null}
      {d.photos.attitudeNote ? <Text tone="muted">{d.photos.attitudeNote}</Text> : null}
      {d.patches.length ? (
        <View style={styles.block} testID="as-flown-patches">
          <Heading level={3}>Where the ground falls short as flown</Heading>
          <BulletList items={d.patches.slice(0, 5).map((pt) => `${areaWords(pt.areaM2)} near ${pt.centroid.lat.toFixed(5)}, ${pt.centroid.lon.toFixed(5)}: ${pt.message}`)} />
          {d.patchCount > 5 ? <Text tone="muted">and {d.patchCount - 5} smaller patches.</Text> : null}
        </View>
      ) : null}
      {d.map ? <AsFlownMap map={d.map} /> : null}
      <View style={styles.block} testID="as-flown-reflight">
        <Heading level={3}>Re-flight</Heading>
        {rf === null ? (
          <Text>Nothing to re-fly: no ground met the spec as planned and was lost in flight.</Text>
        ) : (
          <>
            <Text>{rf.covers}</Text>
            {rf.lineCount > 0 ? (
              <FigureGrid
                figures={[
                  { key: 'areas', label: 'Areas', value: String(rf.areas.length) },
                  { key: 'lines', label: 'Lines', value: String(rf.lineCount) },
                  { key: 'photos', label: 'Photos', value: String(rf.photoCount) },
                  { key: 'time', label: 'Flight time', value: formatDuration(rf.flightTimeS) },
                ]}
              />
            ) : null}
            {rf.stretches && rf.lineCount > 0 ? <ReflightStretches stretches={rf.stretches} signedOff={signedOff} units={units} datum={d.heights.datum ?? 'the grid\u2019s vertical datum'} /> : null}
            {reflight.mayMake && rf.missions.length > 0 ? <ReflightAction check={check} reflight={reflight} /> : null}
            {rf.smallPatchCells > 0 ? (
              <Text tone="muted">
                {rf.smallPatchCells} lost cells lie in patches too small to be worth a re-flight (under a quarter of one photo&apos;s ground) and are left out.
              </Text>
            ) : null}
          </>
        )}
      </View>
      <Text variant="label" tone="muted">{d.heights.reference} {d.heights.conversions}</Text>
      <Banner tone="caution" title="Before any re-flight">
        <BulletList items={d.cautions} tone="caution" />
      </Banner>
    </View>
  );
}

function ReflightAction({ check, reflight }: { check: AsFlownCheck; reflight: ReturnType<typeof useReflightPlans> }) {
  const st = reflight.state;
  const n = check.document.reflight?.missions.length ?? 0;
  return (
    <View style={styles.block} testID="as-flown-reflight-plans">
      {st.kind === 'saved' ? (
        <>
          <Text>Saved as {st.plans.length} new plan{st.plans.length === 1 ? '' : 's'} of this project. Run each, send it for review, and fly it once signed off:</Text>
          {st.plans.map((pl) => <TextLink key={pl.id} href={pl.href} label={pl.name} />)}
        </>
      ) : (
        <Button
          label={st.kind === 'saving' ? `Saving re-flight plan ${st.done + 1} of ${st.total}…` : `Save the re-flight as ${n} new plan${n === 1 ? '' : 's'}`}
          disabled={st.kind === 'saving'}
          onPress={() => reflight.save(check, formatDay(check.createdAt))}
          testID="as-flown-reflight-save"
        />
      )}
      {st.kind === 'failed' ? <Banner tone="danger" title="The re-flight plans could not all be saved" message={st.message} /> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  history: { gap: space.xs },
  result: { gap: space.md },
  headline: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  block: { gap: space.xs },
});
