import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { flightCautions, generalCautions, missionCautions, regulationsCaution } from '../../contracts/cautions';
import { signedOffMail } from '../../server/mail/templates';

const facts = { surfaceKind: 'bare-earth' as const, verticalDatum: 'EGM96 height', maxAglM: 120, obstacleAllowanceM: 0 };

function sourceFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    return e.isDirectory() ? sourceFiles(p) : /\.(ts|tsx)$/.test(e.name) ? [p] : [];
  });
}

describe('safety cautions', () => {
  it('end, in every list, with the rule that local regulations and licensed practice govern', () => {
    expect(generalCautions.at(-1)).toBe(regulationsCaution);
    expect(flightCautions(facts).at(-1)).toBe(regulationsCaution);
    expect(flightCautions({ ...facts, surfaceKind: 'surface' }).at(-1)).toBe(regulationsCaution);
  });

  it('name the reference of every height they mention', () => {
    const text = flightCautions(facts).join(' ');
    expect(text).toMatch(/120 m above ground level/);
    expect(text).toMatch(/above the vertical datum EGM96 height/);
  });

  it('say the camera tilt of a plan flown with the camera tilted, before the closing rule, and nothing of it otherwise', () => {
    const tilted = flightCautions({ ...facts, cameraTiltsDeg: [35] });
    expect(tilted).toHaveLength(flightCautions(facts).length + 1);
    expect(tilted.at(-2)).toMatch(/^The camera is tilted 35° from straight down towards the nose on the lines marked so, and straight down on the others/);
    expect(tilted.at(-1)).toBe(regulationsCaution);
    expect(flightCautions({ ...facts, cameraTiltsDeg: [20, 35] }).join(' ')).toContain('tilted 20°–35° from straight down');
    expect(flightCautions({ ...facts, cameraTiltsDeg: [] })).toEqual(flightCautions(facts));
    expect(missionCautions({ ...facts, cameraTiltsDeg: [35] }).join(' ')).toContain('The MAVLink mission items point the gimbal before each line');
  });

  it('go out with the sign-off mail', () => {
    const mail = signedOffMail({ teamName: 'T', projectName: 'P', planName: 'N', versionNumber: 1, link: 'https://x.example/a', to: 'a@x.example', signerName: 'S', signedOffAt: new Date(0), pdfName: 'r.pdf' });
    for (const c of generalCautions) expect(mail.text).toContain(c);
  });

  it('are worded in one place: no other source file repeats a caution sentence', () => {
    const sentences = [...generalCautions, ...flightCautions(facts)].map((c) => c.slice(0, 60));
    const offenders = ['server', 'components', 'app', 'cli', 'terrain'].flatMap(sourceFiles).filter((f) => {
      const text = fs.readFileSync(f, 'utf8');
      return sentences.some((s) => text.includes(s));
    });
    expect(offenders).toEqual([]);
  });
});
