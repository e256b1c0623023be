import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { complianceReportSchema, type ComplianceReport } from '../../contracts/reports';
import { fmt } from '../../contracts/format/figures';
import { analysePlan } from '../../terrain/plan';
import { analysedResult, createVersion, syntheticMission, fixtureHole, freshTeam, syntheticGrid, type FreshTeam } from '../support/fixtures';
import { startTestServer, type TestServer } from '../support/test-server';
import { numpyFigures, pdfFonts, pdfText } from '../reports/pdf-text';
import { signOffBody } from '../support/review-helpers';

let srv: TestServer;
let team: FreshTeam;

beforeAll(async () => {
  srv = await startTestServer({ web: false });
  team = await freshTeam(srv, 'reports');
});
afterAll(async () => srv?.stop());

async function pdfOf(path: string): Promise<Buffer> {
  const res = await fetch(srv.url + path + '/report.pdf', { headers: { Cookie: cookieOf(team.clients.surveyor) } });
  expect(res.status).toBe(200);
  expect(res.headers.get('content-type')).toBe('application/pdf');
  return Buffer.from(await res.arrayBuffer());
}

function cookieOf(c: unknown): string {
  return [...(c as { cookies: Map<string, string> }).cookies].map(([k, v]) => `${k}=${v}`).join('; ');
}

describe('the compliance report (JSON)', () => {
  it('reports per line and overall GSD figures as numpy computes them from the stations', async () => {
    const result = analysedResult(syntheticGrid({ hole: fixtureHole }));
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, result });
    const res = await team.clients.surveyor.get(`${v.path}/report`);
    expect(res.status).toBe(200);
    const r: ComplianceReport = complianceReportSchema.parse(res.body);
    expect(r.spec).toMatchObject({ targetGsdCm: 3, gsdTolerance: 0.1, forwardOverlap: 0.8, sideOverlap: 0.7, clearanceM: 30, maxAglM: 120 });
    const band = r.spec.gsdBandCm;
    expect(band[0]).toBeCloseTo(2.7, 12);
    expect(band[1]).toBeCloseTo(3.3, 12);

    // numpy 1.24.2 (Debian python3-numpy): np.percentile default 'linear', np.median; share counted over all stations.
    const lists = result.lines.map((l) => l.stations.map((s) => s.gsdCm));
    const ref = numpyFigures([...lists, lists.flat()], band);
    r.lines.forEach((line, i) => {
      expect(line.gsdCm.min).toBeCloseTo(ref[i].min, 10);
      expect(line.gsdCm.p5).toBeCloseTo(ref[i].p5, 10);
      expect(line.gsdCm.median).toBeCloseTo(ref[i].median, 10);
      expect(line.gsdCm.max).toBeCloseTo(ref[i].max, 10);
      expect(line.shareMeetingGsd).toBeCloseTo(ref[i].share, 12);
    });
    const all = ref[ref.length - 1];
    expect(r.overall.gsdCm.median).toBeCloseTo(all.median, 10);
    expect(r.overall.gsdCm.p5).toBeCloseTo(all.p5, 10);
    expect(r.overall.shareMeetingGsd).toBeCloseTo(all.share, 12);

    // Stations over the nodata block are unknown: counted, not known, and against the share.
    const unknown = result.lines[0].stations.filter((s) => s.gsdCm === null).length;
    expect(unknown).toBeGreaterThan(0);
    expect(r.lines[0].stationCount - r.lines[0].knownCount).toBe(unknown);
    expect(r.lines[0].shareMeetingGsd!).toBeLessThanOrEqual((r.lines[0].stationCount - unknown) / r.lines[0].stationCount);
    expect(r.lines[0].warnings.join(' ')).toMatch(/No elevation data here/);
    const stations = result.lines.flatMap((l) => l.stations);
    expect(r.overall.forwardOverlapMin).toBe(Math.min(...stations.filter((s) => s.forwardOverlap !== null).map((s) => s.forwardOverlap!)));
    expect(r.overall.aglMinM).toBe(Math.min(...stations.filter((s) => s.aglM !== null).map((s) => s.aglM!)));
  });

  it('names the DEM, labels accuracy ADVISORY with its rule of thumb, and carries the cautions', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id });
    const r: ComplianceReport = (await team.clients.owner.get(`${v.path}/report`)).body;
    expect(r.dem).toMatchObject({ fileName: 'hollin-fell-synthetic.tif', crs: { epsg: 32630 }, resolution: [5, 5], resolutionUnit: 'metre', verticalDatum: 'EGM96 geoid', surfaceKind: 'bare-earth' });
    expect(r.accuracy.label).toBe('ADVISORY');
    expect(r.accuracy.source).toBe('common practice');
    const g = r.overall.gsdCm.median!;
    // Rule of thumb (common practice, see shared domain notes): horizontal 1-2 x GSD, vertical 1.5-3 x GSD.
    expect(r.accuracy.horizontalCm).toEqual([g, 2 * g]);
    expect(r.accuracy.verticalCm).toEqual([1.5 * g, 3 * g]);
    expect(r.accuracy.deferral).toMatch(/check points/);
    expect(r.cautions.join(' ')).toMatch(/bare earth.*trees/i);
    expect(r.cautions.join(' ')).toMatch(/line of sight/);
    expect(r.cautions.join(' ')).toMatch(/Wind/);
    expect(r.cautions.join(' ')).toMatch(/takeoff point/);
    expect(r.signOff).toMatchObject({ state: 'draft', signedOffBy: null });
    expect(r.percentileMethod).toMatch(/numpy/);
  });

  it('checks the spec: a plan flying above the height limit fails that check', async () => {
    const result = analysedResult();
    for (const l of result.lines) for (const s of l.stations) if (s.aglM !== null) s.aglM += 20;
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, result });
    const r: ComplianceReport = (await team.clients.surveyor.get(`${v.path}/report`)).body;
    const byKey = Object.fromEntries(r.checks.map((c) => [c.key, c.pass]));
    expect(byKey).toMatchObject({ 'height-limit': false, clearance: true });
    expect(byKey['forward-overlap']).toBe(r.overall.forwardOverlapMin! >= 0.8);
  });

  it('states each overlap requirement as planned and as guaranteed under the attitude envelope, met only when both are', async () => {
    const input = syntheticMission({ forwardOverlap: 0.6, sideOverlap: 0.5, envelope: { preset: 'multirotor', rollDeg: 5, pitchDeg: 5 } } as never);
    const result = JSON.parse(JSON.stringify(analysePlan(syntheticGrid(), input)));
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, result, input });
    const r: ComplianceReport = complianceReportSchema.parse((await team.clients.surveyor.get(`${v.path}/report`)).body);
    const st = result.lines.flatMap((l: { stations: Array<Record<string, number | null>> }) => l.stations);
    const least = (k: string) => Math.min(...st.map((s: Record<string, number | null>) => s[k]).filter((x: number | null): x is number => x !== null));
    const fwd = r.checks.find((c) => c.key === 'forward-overlap')!, side = r.checks.find((c) => c.key === 'side-overlap')!;
    expect(fwd.achieved).toBe(`minimum ${fmt.percent(least('forwardOverlap'), 'min')} as planned, ${fmt.percent(least('forwardOverlapGuaranteed'), 'min')} as guaranteed under ±5° roll, ±5° pitch`);
    expect(side.achieved).toBe(`minimum ${fmt.percent(least('sideOverlap'), 'min')} as planned, ${fmt.percent(least('sideOverlapGuaranteed'), 'min')} as guaranteed under ±5° roll, ±5° pitch`);
    // met only where the planned and the guaranteed figure both hold
    expect(fwd.pass).toBe(least('forwardOverlap') >= 0.6 && least('forwardOverlapGuaranteed') >= 0.6);
    expect(side.pass).toBe(least('sideOverlap') >= 0.5 && least('sideOverlapGuaranteed') >= 0.5);
    expect(least('sideOverlapGuaranteed')).toBeLessThan(Math.min(0.5, least('sideOverlap')));
    expect(side.pass).toBe(false);
    // the PDF prints the same requirement line
    const text = pdfText(await pdfOf(v.path)).replace(/\s+/g, ' ');
    // (the cell wraps inside the requirements table, so its words come in two runs between the other columns')
    expect(text).toContain(`minimum ${fmt.percent(least('forwardOverlap'), 'min')} as planned, ${fmt.percent(least('forwardOverlapGuaranteed'), 'min')}`);
    expect(text).toContain(`minimum ${fmt.percent(least('sideOverlap'), 'min')} as planned, ${fmt.percent(least('sideOverlapGuaranteed'), 'min')}`);
    expect(text).toContain('as guaranteed under ±5° roll, ±5°');
    // without an envelope the figures are said to be as planned only
    const plain = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id });
    const q: ComplianceReport = (await team.clients.surveyor.get(`${plain.path}/report`)).body;
    expect(q.checks.find((c) => c.key === 'forward-overlap')!.achieved).toMatch(/^minimum \d+(\.\d)? % as planned \(no attitude envelope: as planned only\)$/);
  });

  it('is refused before the analysis is done, to pilots, and to other teams', async () => {
    const queued = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, analysisState: 'running' });
    const r1 = await team.clients.surveyor.get(`${queued.path}/report`);
    expect(r1.status).toBe(409);
    expect(r1.body.error.code).toBe('analysis_not_done');
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'signed_off' });
    expect((await team.clients.pilot.get(`${v.path}/report`)).status).toBe(403);
    const other = await freshTeam(srv, 'reports-other');
    expect((await other.clients.owner.get(`/api/teams/${other.teamId}/plans/${v.planId}/versions/${v.versionId}/report`)).status).toBe(404);
  });
});

describe('the compliance report (PDF)', () => {
  it('parses, embeds its fonts, and prints the figures the API reports for that version', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'in_review', result: analysedResult(syntheticGrid({ hole: fixtureHole })) });
    expect((await team.clients.surveyor.post(`${v.path}/sign-off`, await signOffBody(team.clients.surveyor, v.path, {}))).status).toBe(200);
    const r: ComplianceReport = (await team.clients.surveyor.get(`${v.path}/report`)).body;
    const pdf = await pdfOf(v.path);
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    const fonts = pdfFonts(pdf);
    expect(fonts.map((f) => f.name.replace(/^[A-Z]+\+/, ''))).toEqual(expect.arrayContaining(['Inter-Regular', 'Inter-Bold']));
    expect(fonts.every((f) => f.embedded)).toBe(true);

    const text = pdfText(pdf);
    const squash = (s: string) => s.replace(/\s+/g, ' ');
    const o = r.overall;
    // figures against a target rounded toward failing, as printed (contracts/target-rounding.ts)
    const overallRow = [String(o.stationCount), fmt.percent(o.shareMeetingGsd, 'min'), fmt.gsdCm(o.gsdCm.min, 'min'), fmt.gsdCm(o.gsdCm.p5), fmt.gsdCm(o.gsdCm.median), fmt.gsdCm(o.gsdCm.max, 'max'), fmt.percent(o.forwardOverlapMin, 'min'), fmt.percent(o.sideOverlapMin, 'min'), fmt.metres(o.aglMinM, 'min')];
    expect(squash(text)).toContain(overallRow.join(' '));
    for (const l of r.lines) {
      const row = [String(l.number), fmt.metres(l.lengthM), fmt.percent(l.shareMeetingGsd, 'min'), fmt.gsdCm(l.gsdCm.min, 'min'), fmt.gsdCm(l.gsdCm.p5), fmt.gsdCm(l.gsdCm.median), fmt.gsdCm(l.gsdCm.max, 'max'), fmt.percent(l.forwardOverlapMin, 'min'), fmt.percent(l.sideOverlapMin, 'min'), fmt.metres(l.aglMinM, 'min')];
      expect(text.split('\n').some((line) => squash(line).trim() === row.join(' ')), `line ${l.number} row ${row.join(' ')}`).toBe(true);
      expect(text).toContain(`Line ${l.number} · ${fmt.metres(l.lengthM)} · heading ${fmt.degrees(l.headingDeg)}`);
    }
    expect(text.match(/distance along the line \(m\)/g)).toHaveLength(r.lines.length);
    expect(squash(text)).toContain(`Signed off by ${team.users.surveyor.name} on ${fmt.utc(r.signOff.signedOffAt)}`);
    expect(text).toContain('ADVISORY');
    expect(squash(text)).toContain(`From the median GSD ${fmt.gsdCm(r.accuracy.basisGsdCm)}`);
    expect(squash(text)).toContain(r.dem.fileName);
    expect(squash(text)).toContain('EPSG:32630');
    for (const c of r.cautions) expect(squash(text)).toContain(squash(c).slice(0, 60));
  });
});
