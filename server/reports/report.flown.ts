/** The report's as-flown confirmation: who confirmed the signed-off version as flown, against which check, and why despite lost items. */
import type { AsFlownCheck } from '../../contracts/as-flown';
import { itemTitle } from '../../contracts/coverage-words';
import type { ReportFlown } from '../../contracts/reports';
import { fmt } from '../../contracts/format/figures';
import type { VersionRecord } from '../versions/versions.repository';

export function reportFlown(v: VersionRecord, required: boolean, latest: AsFlownCheck | null): ReportFlown {
  const at = v.flownConfirmedAt ? v.flownConfirmedAt.toISOString() : null;
  const by = v.flownConfirmedById ? (v.flownConfirmedByName ?? '(former member)') : null;
  const label = (key: string) => (latest ? itemTitle(key as never, latest.document.spec) : key);
  const statement = at
    ? `Confirmed as flown by ${by} on ${fmt.utc(at)}, against a check of the flight's photos.`
    : v.reviewState !== 'signed_off'
      ? 'Not confirmed as flown: the version is not signed off.'
      : required
        ? 'NOT YET CONFIRMED AS FLOWN: the team requires a surveyor to confirm this version against a check of its photos before its review is complete.'
        : 'Not confirmed as flown (the team does not require it).';
  return { required, confirmedBy: by, confirmedAt: at, statement, reasons: (v.flownReasons ?? []).map((r) => ({ key: r.key, label: label(r.key), reason: r.reason })) };
}
