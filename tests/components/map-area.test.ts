import { DOMParser } from '@xmldom/xmldom';
import { describe, expect, it } from 'vitest';
import { checkArea, checkTakeoff, openRing, ringToPolygon, type LonLat } from '../../components/map/area-check';
import { drawingReducer, initialDrawing, type DrawingState } from '../../components/map/area-drawing';
import { AreaImportError, parseAreaFile, parseGeoJsonArea, parseKmlArea } from '../../components/map/area-import';
import { boundsGeoref } from '../../components/map/image-georef';

// A 1000 x 1000 px image over 0.01 degrees square: one pixel is 1e-5 degrees.
const georef = boundsGeoref(1000, 1000, [10, 45, 10.01, 45.01]);
const square: LonLat[] = [[10.002, 45.002], [10.008, 45.002], [10.008, 45.008], [10.002, 45.008]];
const xml = (text: string) => new DOMParser().parseFromString(text, 'application/xml') as unknown as Document;

describe('checkArea', () => {
  it('accepts a square inside the grid', () => {
    expect(checkArea(square, georef)).toBeNull();
  });

  it('refuses fewer than 3 corners and says how many it has', () => {
    expect(checkArea(square.slice(0, 2), georef)).toMatchObject({ code: 'too-few-corners', message: expect.stringMatching(/it has 2/) });
  });

  it('refuses a corner off the grid and names the corner', () => {
    const off: LonLat[] = [...square.slice(0, 2), [10.0105, 45.008], square[3]];
    expect(checkArea(off, georef)).toMatchObject({ code: 'outside-grid', message: expect.stringMatching(/^Corner 3 /) });
  });

  it('refuses a bow-tie outline that crosses itself and says where', () => {
    const bowTie: LonLat[] = [square[0], square[2], square[1], square[3]];
    const problem = checkArea(bowTie, georef);
    expect(problem?.code).toBe('crosses-itself');
    expect(problem?.message).toMatch(/45\.00500° N, 10\.00500° E/); // the diagonals meet at the centre
  });

  it('refuses corners that all lie on one line', () => {
    expect(checkArea([[10.002, 45.002], [10.004, 45.004], [10.006, 45.006]], georef)?.code).toBe('no-area');
  });

  it('does not mutate the corners it is given', () => {
    const copy = structuredClone(square);
    checkArea(square, georef);
    expect(square).toEqual(copy);
  });
});

describe('openRing and ringToPolygon', () => {
  it('drops the repeated closing corner and repeated taps, and closes the GeoJSON ring again', () => {
    const ring: LonLat[] = [square[0], square[1], square[1], square[2], square[3], square[0]];
    expect(openRing(ring)).toEqual(square);
    const poly = ringToPolygon(ring);
    expect(poly.coordinates[0]).toHaveLength(5);
    expect(poly.coordinates[0][4]).toEqual(poly.coordinates[0][0]);
  });
});

describe('checkTakeoff', () => {
  it('asks for a takeoff point when there is none and refuses one off the grid', () => {
    expect(checkTakeoff(null, georef)).toMatch(/Tap the hillshade/);
    expect(checkTakeoff([10.02, 45.005], georef)).toMatch(/off the elevation grid/);
    expect(checkTakeoff([10.005, 45.005], georef)).toBeNull();
  });
});

describe('drawingReducer', () => {
  const reduce = drawingReducer(georef);

  it('adds corners by tapping, undoes the last one, and closes a valid ring', () => {
    let s = initialDrawing();
    for (const p of square) s = reduce(s, { type: 'tap', at: p });
    s = reduce(s, { type: 'tap', at: [10.005, 45.009] });
    s = reduce(s, { type: 'undo' });
    expect(s.corners).toEqual(square);
    s = reduce(s, { type: 'close' });
    expect(s.closed).toBe(true);
    expect(s.tool).toBe('takeoff'); // next tap places the takeoff
    s = reduce(s, { type: 'tap', at: [10.001, 45.001] });
    expect(s.takeoff).toEqual([10.001, 45.001]);
    expect(s.corners).toEqual(square);
  });

  it('keeps the ring open and says why when closing a crossing outline', () => {
    let s = initialDrawing();
    for (const p of [square[0], square[2], square[1], square[3]]) s = reduce(s, { type: 'tap', at: p });
    s = reduce(s, { type: 'close' });
    expect(s.closed).toBe(false);
    expect(s.problem?.code).toBe('crosses-itself');
  });

  it('reopens a closed ring on undo instead of dropping a corner', () => {
    let s = initialDrawing(square);
    expect(s.closed).toBe(true);
    s = reduce(s, { type: 'undo' });
    expect(s.closed).toBe(false);
    expect(s.corners).toHaveLength(4);
  });

  it('moves a corner of a closed area and keeps it closed while it passes the checks, leaving the takeoff point where it was', () => {
    let s: DrawingState = { ...initialDrawing(square, [10.002, 45.002]), tool: 'takeoff' };
    s = reduce(s, { type: 'moveCorner', index: 0, at: [10.001, 45.0015] });
    expect(s.corners[0]).toEqual([10.001, 45.0015]);
    expect(s.corners.slice(1)).toEqual(square.slice(1));
    expect(s.closed).toBe(true);
    expect(s.takeoff).toEqual([10.002, 45.002]);
  });

  it('opens the area with the crossing message when a moved corner makes it cross itself, and closes it again once moved back', () => {
    let s = initialDrawing(square);
    s = reduce(s, { type: 'moveCorner', index: 0, at: [10.009, 45.005] }); // corner 1 past the far side: the outline crosses
    expect(s.closed).toBe(false);
    expect(s.problem?.code).toBe('crosses-itself');
    expect(s.problem?.message).toMatch(/Move or remove corners/);
    expect(reduce(s, { type: 'tap', at: [10.005, 45.005] }).corners).toHaveLength(4); // stray taps add nothing meanwhile
    s = reduce(s, { type: 'moveCorner', index: 0, at: square[0] });
    expect(s.closed).toBe(true);
    expect(s.problem).toBeNull();
  });

  it('removes a chosen corner, rechecking a closed area; below three corners the area is open', () => {
    const five: LonLat[] = [...square.slice(0, 2), [10.009, 45.005], ...square.slice(2)];
    let s = initialDrawing(five);
    s = reduce(s, { type: 'removeCorner', index: 2 });
    expect(s.corners).toEqual(square);
    expect(s.closed).toBe(true);
    s = reduce(reduce(s, { type: 'removeCorner', index: 0 }), { type: 'removeCorner', index: 0 });
    expect(s.corners).toHaveLength(2);
    expect(s.closed).toBe(false);
    expect(reduce(s, { type: 'removeCorner', index: 7 })).toBe(s);
  });

  it('moves the takeoff point by dragging, whatever the tool', () => {
    const s = reduce({ ...initialDrawing(square, [10.001, 45.001]), tool: 'area' }, { type: 'moveTakeoff', at: [10.003, 45.003] });
    expect(s.takeoff).toEqual([10.003, 45.003]);
    expect(s.corners).toEqual(square);
  });

  it('refuses an imported area that leaves the grid and keeps the previous drawing', () => {
    const s0 = initialDrawing(square);
    const s = reduce(s0, { type: 'import', ring: [[9, 45], [9.5, 45], [9.5, 45.5]], note: null });
    expect(s.problem?.code).toBe('outside-grid');
    expect(s.corners).toEqual(square);
  });
});

describe('area import', () => {
  const feature = { type: 'Feature', properties: {}, geometry: ringToPolygon(square) };

  it('reads a GeoJSON Feature, a FeatureCollection and a bare Polygon alike', () => {
    expect(parseGeoJsonArea(JSON.stringify(feature)).ring).toEqual(square);
    expect(parseGeoJsonArea(JSON.stringify({ type: 'FeatureCollection', features: [feature] })).ring).toEqual(square);
    expect(parseGeoJsonArea(JSON.stringify(feature.geometry)).ring).toEqual(square);
  });

  it('refuses a file with two polygons, with none, or with projected coordinates, saying which', () => {
    const two = { type: 'FeatureCollection', features: [feature, feature] };
    expect(() => parseGeoJsonArea(JSON.stringify(two))).toThrow(/holds 2 polygons/);
    expect(() => parseGeoJsonArea(JSON.stringify({ type: 'Point', coordinates: [10, 45] }))).toThrow(/holds no polygon/);
    const utm = { type: 'Polygon', coordinates: [[[500000, 5000000], [500100, 5000000], [500100, 5000100], [500000, 5000000]]] };
    expect(() => parseGeoJsonArea(JSON.stringify(utm))).toThrow(/EPSG:4326/);
    expect(() => parseGeoJsonArea('not json')).toThrow(AreaImportError);
  });

  it('keeps the outer ring of a polygon with a hole and notes that the hole was left out', () => {
    const hole = [[10.004, 45.004], [10.005, 45.004], [10.005, 45.005], [10.004, 45.004]];
    const withHole = { type: 'Polygon', coordinates: [ringToPolygon(square).coordinates[0], hole] };
    const got = parseGeoJsonArea(JSON.stringify(withHole));
    expect(got.ring).toEqual(square);
    expect(got.note).toMatch(/1 hole was left out/);
  });

  // KML 2.2 (OGC 07-147r2): <coordinates> holds lon,lat[,alt] tuples separated by white space.
  const kmlText = `<?xml version="1.0" encoding="UTF-8"?>
<kml xmlns="http://www.opengis.net/kml/2.2"><Document><Placemark><name>Upper field</name>
<Polygon><outerBoundaryIs><LinearRing><coordinates>
10.002,45.002,0 10.008,45.002,0 10.008,45.008,0 10.002,45.008,0 10.002,45.002,0
</coordinates></LinearRing></outerBoundaryIs></Polygon></Placemark></Document></kml>`;

  it('reads a KML polygon placemark through togeojson', () => {
    expect(parseKmlArea(kmlText, xml).ring).toEqual(square);
    expect(parseAreaFile('field.KML', kmlText, xml).ring).toEqual(square);
  });

  it('refuses XML that is not KML and a file that is neither format', () => {
    expect(() => parseKmlArea('<gpx></gpx>', xml)).toThrow(/root element must be <kml>/);
    expect(() => parseAreaFile('area.txt', 'corner list', xml)).toThrow(/neither GeoJSON nor KML/);
  });
});
