/** Read PDFs back in tests with poppler-utils (Debian 12: 22.12.0; `npm test` installs it via scripts/bootstrap.sh). */
import { execFileSync, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

/** The text of a PDF as `pdftotext -layout` prints it (table rows stay on one line); throws if poppler reports errors. */
export function pdfText(pdf: Buffer): string {
  const r = spawnSync('pdftotext', ['-layout', '-enc', 'UTF-8', '-', '-'], { input: pdf, maxBuffer: 32 * 1024 * 1024 });
  const stderr = r.stderr?.toString('utf8') ?? '';
  if (r.status !== 0 || /error/i.test(stderr)) throw new Error(`pdftotext could not read the PDF cleanly (status ${r.status}): ${stderr.trim()}`);
  return r.stdout.toString('utf8');
}

/** Fonts listed by `pdffonts`: name and whether embedded. */
export function pdfFonts(pdf: Buffer): Array<{ name: string; embedded: boolean }> {
  const out = execFileSync('pdffonts', ['-'], { input: pdf }).toString('utf8').split('\n').slice(2).filter(Boolean);
  return out.map((line) => {
    const cols = line.trim().split(/\s+/);
    // name type... encoding emb sub uni object ID: "emb" is the 5th column from the end.
    return { name: cols[0], embedded: cols[cols.length - 5] === 'yes' };
  });
}

/** Figures computed by numpy (Debian python3-numpy 1.24.2) for each list: min, 5th percentile, median, max, share in band. */
export function numpyFigures(lists: Array<Array<number | null>>, band: [number, number]) {
  const script = [
    'import json, sys, numpy as np',
    'd = json.load(sys.stdin); lo, hi = d["band"]; out = []',
    'for vals in d["lists"]:',
    '    a = np.array([v for v in vals if v is not None], dtype=np.float64)',
    '    inside = int(np.count_nonzero((a >= lo) & (a <= hi)))',
    '    out.append({"min": float(a.min()), "p5": float(np.percentile(a, 5)), "median": float(np.median(a)), "max": float(a.max()), "share": inside / len(vals)})',
    'print(json.dumps(out))',
  ].join('\n');
  const res = execFileSync('/usr/bin/python3', ['-c', script], { input: JSON.stringify({ lists, band }) }).toString('utf8');
  return JSON.parse(res) as Array<{ min: number; p5: number; median: number; max: number; share: number }>;
}

/** Images in a PDF as `pdfimages -list` prints them: width and height in pixels (PDFKit puts an RGBA PNG's alpha in an soft mask of its own). */
export function pdfImages(pdf: Buffer): Array<{ type: string; width: number; height: number }> {
  const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'loftline-pdfimages-')), 'report.pdf');
  fs.writeFileSync(file, pdf);
  const r = spawnSync('pdfimages', ['-list', file], { maxBuffer: 8 * 1024 * 1024 });
  fs.rmSync(path.dirname(file), { recursive: true, force: true });
  if (r.status !== 0) throw new Error(`pdfimages could not list the PDF's images (status ${r.status}): ${r.stderr?.toString('utf8')}`);
  return r.stdout.toString('utf8').split('\n').slice(2).filter(Boolean).map((line) => {
    const cols = line.trim().split(/\s+/);
    return { type: cols[2], width: Number(cols[3]), height: Number(cols[4]) };
  });
}
