import { describe, expect, it } from 'vitest';
import { PhotoLogError, parsePhotoLogCsv, photoLogToCsv, photoRecordSchema } from '../../contracts/photo-log';

const HEADER = 'file,lon,lat,altitudeM,altitudeRef,yawDeg,pitchDeg,rollDeg,time';
const row = (over: Partial<Record<string, string>> = {}) => {
  const r = { file: 'IMG_0001.JPG', lon: '4.4812', lat: '46.7691', altitudeM: '512.3', altitudeRef: 'ellipsoid', yawDeg: '93.5', pitchDeg: '1.5', rollDeg: '-0.5', time: '2026-05-14T09:31:07Z', ...over };
  return [r.file, r.lon, r.lat, r.altitudeM, r.altitudeRef, r.yawDeg, r.pitchDeg, r.rollDeg, r.time].join(',');
};
const problems = (text: string): string[] => {
  try { parsePhotoLogCsv(text); } catch (err) { if (err instanceof PhotoLogError) return err.problems; throw err; }
  return [];
};

describe('CSV photo log', () => {
  it('reads the header row and one record per photo; empty attitude cells are null', () => {
    const recs = parsePhotoLogCsv(`\uFEFF${HEADER}\n${row()}\n${row({ file: 'IMG_0002.JPG', yawDeg: '', pitchDeg: '', rollDeg: '', altitudeRef: 'takeoff', time: '2026-05-14T11:31:09+02:00' })}\n`);
    expect(recs).toEqual([
      { file: 'IMG_0001.JPG', lon: 4.4812, lat: 46.7691, altitudeM: 512.3, altitudeRef: 'ellipsoid', yawDeg: 93.5, pitchDeg: 1.5, rollDeg: -0.5, time: '2026-05-14T09:31:07Z' },
      { file: 'IMG_0002.JPG', lon: 4.4812, lat: 46.7691, altitudeM: 512.3, altitudeRef: 'takeoff', yawDeg: null, pitchDeg: null, rollDeg: null, time: '2026-05-14T11:31:09+02:00' },
    ]);
  });

  it('takes the optional focal length and camera model columns, and writes what it reads', () => {
    const text = `${HEADER},focalLengthMm,cameraModel\n${row()},8.8,"Cam, model 2"\n`;
    const recs = parsePhotoLogCsv(text);
    expect(recs[0]).toMatchObject({ focalLengthMm: 8.8, cameraModel: 'Cam, model 2' });
    expect(parsePhotoLogCsv(photoLogToCsv(recs))).toEqual(recs);
    expect(photoRecordSchema.safeParse(recs[0]).success).toBe(true);
  });

  it('numbers every bad row (the header is row 1) and says what is wrong and what to do', () => {
    const text = [HEADER, row(), row({ file: 'b', lat: '95' }), row({ file: 'c', lon: 'east' }), row({ file: 'd', altitudeRef: 'msl' }), row({ file: 'e', time: '14/05/2026' }), row({ file: 'IMG_0001.JPG' }), row({ file: 'f', altitudeM: '' })].join('\n');
    expect(problems(text)).toEqual([
      'row 3: lat 95 is outside -90..90; fix the photo log',
      'row 4: lon east is not a number; fix the photo log',
      'row 5: altitudeRef msl is not one of ellipsoid, datum, takeoff; fix the photo log',
      'row 6: time must be an ISO 8601 date and time, e.g. 2026-05-14T10:31:07Z (got 14/05/2026); fix the photo log',
      'row 7: file IMG_0001.JPG is listed again (first in row 2); fix the photo log',
      'row 8: altitudeM is empty; fix the photo log',
    ]);
    expect(() => parsePhotoLogCsv(text)).toThrow(/^row 3: lat 95 is outside -90..90; fix the photo log; row 4: .*; and 1 more problems$/);
  });

  it('refuses a wrong header, a short row and an empty log with the reason', () => {
    expect(problems('file,lon,lat,alt\nx,1,2,3')[0]).toMatch(/^row 1 \(header\): missing columns altitudeM, altitudeRef, yawDeg, pitchDeg, rollDeg, time; unknown column alt; the header must be `file,lon,lat,altitudeM,altitudeRef,yawDeg,pitchDeg,rollDeg,time`/);
    expect(problems(`${HEADER}\nIMG_1,4.4,46.7`)).toEqual(['row 2: 3 cells where the header has 9; fix the photo log']);
    expect(problems('')[0]).toMatch(/the photo log is empty/);
    expect(problems(`${HEADER}\n`)).toEqual(['the photo log has a header but no photos']);
  });
});
