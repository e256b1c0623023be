import { describe, expect, it } from 'vitest';
import { summariseUnmet } from '../../server/reports/report.build';

describe('summariseUnmet', () => {
  it('gives one sentence per reason with the count, total length and the longest stretch', () => {
    const out = summariseUnmet([
      { startM: 0, endM: 10, reason: 'climb-limit', message: 'climb A (up to 5 m)' },
      { startM: 50, endM: 80, reason: 'climb-limit', message: 'climb B (up to 9 m)' },
      { startM: 100, endM: 104, reason: 'above-max-agl', message: 'over the cap' },
    ]);
    expect(out).toEqual(['2 stretches, 40 m in all: climb B (up to 9 m)', 'over the cap']);
  });

  it("carries on the engine's sentence after the colon without its capital, but keeps an abbreviation's", () => {
    const out = summariseUnmet([
      { startM: 0, endM: 10, reason: 'descent-limit', message: 'The descent limit keeps the aircraft high.' },
      { startM: 20, endM: 32, reason: 'descent-limit', message: 'The descent limit keeps the aircraft high after a crest.' },
      { startM: 40, endM: 41, reason: 'hold', message: 'GSD off band here.' },
      { startM: 50, endM: 52, reason: 'hold', message: 'GSD off band over a crest.' },
    ]);
    expect(out).toEqual(['2 stretches, 22 m in all: the descent limit keeps the aircraft high after a crest.', '2 stretches, 3 m in all: GSD off band over a crest.']);
  });

  it('says nothing when every stretch was held', () => {
    expect(summariseUnmet([])).toEqual([]);
  });
});
