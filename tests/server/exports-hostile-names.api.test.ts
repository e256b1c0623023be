import { gpx, kml } from '@tmcw/togeojson';
import { DOMParser } from '@xmldom/xmldom';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { LegSheet } from '../../contracts/flights';
import type { Mailer } from '../../server/mail/mailer';
import { pdfText } from '../reports/pdf-text';
import { createVersion, freshTeam, type FreshTeam, type VersionFixture } from '../support/fixtures';
import { startTestServer, type TestServer } from '../support/test-server';

// Names an attacker (or an unlucky client) could type: markup that would close the name and inject a placemark, an
// ampersand, a CDATA end, both quotes, a right-to-left override (U+202E) and a NUL.
const rlo = '\u202E';
const hostile = {
  project: `Smith & Sons quarry "north" 'pit' ]]> ${rlo}tfel${'\u202C'} end`,
  plan: `</name><Placemark><name>TAKEOFF</name><Point><coordinates>0,0,0</coordinates></Point></Placemark><name>\u0000x`,
  datum: `=HYPERLINK("http://evil.example") & <b>`,
};
/** What every output must show instead: the same text with the bidi controls and the NUL removed, nothing else. */
const shown = {
  project: `Smith & Sons quarry "north" 'pit' ]]> tfel end`,
  plan: `</name><Placemark><name>TAKEOFF</name><Point><coordinates>0,0,0</coordinates></Point></Placemark><name>x`,
  datum: hostile.datum,
};
const title = `${shown.plan} v1 (${shown.project})`;

/** Characters XML 1.0 (section 2.2) forbids, and the bidi controls that must never reach a file. */
const forbidden = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u202A-\u202E\u2066-\u2069\uFFFE\uFFFF]/;

/** @xmldom/xmldom's parser with an error handler that throws on any warning or error. */
function strictXml(text: string): Document {
  expect(text).not.toMatch(forbidden);
  return new DOMParser({
    onError: (level, msg) => {
      throw new Error(`XML ${level}: ${msg}`);
    },
  }).parseFromString(text, 'text/xml') as unknown as Document;
}

let srv: TestServer;
let team: FreshTeam;
let v: VersionFixture;
let sheet: LegSheet;
let waypointCount: number;

beforeAll(async () => {
  srv = await startTestServer({ web: false });
  team = await freshTeam(srv, 'hostile');
  v = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id, reviewState: 'signed_off' });
  await srv.db.$client.query('update project set name = $1 where id = $2', [hostile.project.replace('\u0000', ''), v.projectId]);
  // PostgreSQL text cannot hold NUL; the plan name carries it in every export through the cleaning path regardless.
  await srv.db.$client.query('update plan set name = $1 where id = $2', [hostile.plan.replace('\u0000', '\u0001'), v.planId]);
  await srv.db.$client.query('update site set vertical_datum = $1 where id = $2', [hostile.datum, v.siteId]);
  sheet = (await team.clients.pilot.get(`/api/teams/${team.teamId}/flights/${v.versionId}/leg-sheet`)).body;
  const geo = (await team.clients.pilot.get(`${v.path}/export.geojson`)).body;
  const fc: { features: Array<{ properties: { kind: string } }> } = typeof geo === 'string' ? JSON.parse(geo) : geo;
  waypointCount = fc.features.filter((f) => f.properties.kind === 'waypoint').length;
});
afterAll(async () => srv?.stop());

async function download(format: string): Promise<string> {
  const res = await team.clients.pilot.get(`${v.path}/export.${format}`);
  expect(res.status).toBe(200);
  return typeof res.body === 'string' ? res.body : JSON.stringify(res.body);
}

describe('exports of a version whose names hold markup, quotes, bidi overrides and control characters', () => {
  it('leg sheet: names shown without the controls', () => {
    expect(waypointCount).toBeGreaterThan(2);
    expect(JSON.stringify(sheet)).not.toMatch(forbidden);
  });

  it('KML: parses strictly, has exactly one placemark per line and waypoint (none injected), and the names round-trip', async () => {
    const doc = strictXml(await download('kml'));
    const placemarks = doc.getElementsByTagName('Placemark');
    expect(placemarks.length).toBe(sheet.lines.length + waypointCount);
    const docEl = doc.getElementsByTagName('Document')[0];
    expect(docEl.getElementsByTagName('name')[0].textContent).toBe(title);
    expect(docEl.getElementsByTagName('description')[0].textContent).toContain(shown.datum);
    // @tmcw/togeojson reads it back: no feature is named TAKEOFF and no point sits at 0,0.
    const fc = kml(doc);
    expect(fc.features).toHaveLength(sheet.lines.length + waypointCount);
    expect(fc.features.map((f) => f.properties?.name)).not.toContain('TAKEOFF');
    expect(fc.features.filter((f) => f.geometry?.type === 'Point' && (f.geometry.coordinates[0] === 0 || f.geometry.coordinates[1] === 0))).toEqual([]);
    expect(fc.features.filter((f) => f.geometry?.type === 'Point').every((f) => f.properties?.verticalDatum === shown.datum)).toBe(true);
  });

  it('GPX: parses strictly, one route per line with every waypoint, and the names round-trip', async () => {
    const doc = strictXml(await download('gpx'));
    expect(doc.getElementsByTagName('metadata')[0].getElementsByTagName('name')[0].textContent).toBe(title);
    expect(doc.getElementsByTagName('rte').length).toBe(sheet.lines.length);
    expect(doc.getElementsByTagName('rtept').length).toBe(waypointCount);
    const fc = gpx(doc);
    expect(fc.features.filter((f) => f.geometry?.type === 'LineString')).toHaveLength(sheet.lines.length);
  });

  it('GeoJSON: JSON.parse reads it, the names round-trip and the feature count is unchanged', async () => {
    const fc = JSON.parse(await download('geojson'));
    expect(fc.name).toBe(title);
    expect(fc.verticalDatum).toBe(shown.datum);
    expect(fc.features.filter((f: { properties: { kind: string } }) => f.properties.kind === 'waypoint')).toHaveLength(waypointCount);
  });

  it('CSV: papaparse reads it without errors; a text cell that starts like a formula is prefixed with an apostrophe', async () => {
    const text = await download('csv');
    expect(text).not.toMatch(forbidden);
    const parsed = Papa.parse<Record<string, unknown>>(text, { header: true, dynamicTyping: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.data).toHaveLength(waypointCount);
    for (const row of parsed.data) {
      expect(row.plan).toBe(title);
      expect(row.verticalDatum).toBe(`'${shown.datum}`);
      expect(typeof row.altitudeAboveTakeoffM).toBe('number'); // numbers, even negative ones, are not prefixed
    }
  });

  it('PDF report: poppler reads it and shows the names without the controls', async () => {
    const got = await team.clients.surveyor.getBytes(`${v.path}/report.pdf`);
    expect(got.status).toBe(200);
    const text = pdfText(got.bytes).replace(/\f/g, '\n'); // pdftotext ends each page with a form feed
    expect(text).not.toMatch(forbidden);
    const flat = text.replace(/\s+/g, ' ');
    expect(flat).toContain('Smith & Sons quarry "north" \'pit\' ]]> tfel end');
    expect(flat).toContain('<Placemark><name>TAKEOFF</name>');
  });
});

describe('mail about a version with a hostile name', () => {
  it('arrives with a one-line subject and a body free of bidi and control characters', async () => {
    const w = await createVersion(srv, { teamId: team.teamId, createdBy: team.users.planner.id });
    await srv.db.$client.query('update plan set name = $1 where id = $2', [`North\r\nBcc: victim@evil.example ${rlo}bench`, w.planId]);
    const res = await team.clients.planner.post(`${w.path}/submit`, { comment: `see ${rlo}this\u0007` });
    expect(res.status).toBe(200);
    const mailer = srv.services.mail as Mailer;
    await mailer.idle();
    const got = mailer.fake!.messages.find((m) => m.to.includes(team.users.surveyor.email) && m.subject.startsWith('Review requested: North'));
    expect(got, 'the review request arrived').toBeDefined();
    expect(got!.subject).toBe('Review requested: North Bcc: victim@evil.example bench v1');
    expect(got!.to).toEqual([team.users.surveyor.email]);
    expect(got!.text).not.toMatch(forbidden);
    expect(got!.text).toContain('see this');
  });
});
