import { describe, expect, it } from 'vitest';
import { ApiError } from '../../components/api/api-error';
import { forgetSheet, maxStoredSheets, readSheet, saveSheet, sheetKey, storedSheets } from '../../components/flights/leg-sheet-storage';
import { isRefusal, pickSheetSource } from '../../components/flights/sheet-source';
import { sampleSheet } from './flights-sheet-fixture';

/** An in-memory stand-in for localStorage with the same three methods. */
function memoryStore(opts: { failWrites?: boolean } = {}) {
  const m = new Map<string, string>();
  return {
    map: m,
    getItem: (k: string) => m.get(k) ?? null,
    setItem: (k: string, v: string) => {
      if (opts.failWrites) throw new Error('QuotaExceededError');
      m.set(k, v);
    },
    removeItem: (k: string) => void m.delete(k),
  };
}

describe('offline copies of leg sheets', () => {
  it('reads back the sheet it saved, with the time it was loaded', () => {
    const store = memoryStore();
    saveSheet('u1', sampleSheet('v1'), new Date('2026-12-02T07:30:00Z'), store);
    const back = readSheet('u1', 'v1', store);
    expect(back?.savedAt).toBe('2026-12-02T07:30:00.000Z');
    expect(back?.sheet).toEqual(sampleSheet('v1'));
  });

  it('keeps copies per user: another user on the same device does not get them', () => {
    const store = memoryStore();
    saveSheet('u1', sampleSheet('v1'), new Date(), store);
    expect(readSheet('u2', 'v1', store)).toBeNull();
    expect(storedSheets('u2', store)).toEqual([]);
  });

  it(`keeps at most ${maxStoredSheets} sheets, dropping the oldest`, () => {
    const store = memoryStore();
    for (let i = 0; i < maxStoredSheets + 3; i++) saveSheet('u1', sampleSheet(`v${i}`), new Date(Date.UTC(2026, 11, 1, 0, i)), store);
    const list = storedSheets('u1', store);
    expect(list).toHaveLength(maxStoredSheets);
    expect(list[0]!.versionId).toBe(`v${maxStoredSheets + 2}`);
    expect(readSheet('u1', 'v0', store)).toBeNull();
    expect(store.map.has(sheetKey('u1', 'v0'))).toBe(false);
  });

  it('ignores a stored copy that no longer fits the contract', () => {
    const store = memoryStore();
    store.setItem(sheetKey('u1', 'v1'), JSON.stringify({ savedAt: '2026-12-02T07:30:00Z', sheet: { version: {} } }));
    expect(readSheet('u1', 'v1', store)).toBeNull();
  });

  it('survives a full storage without throwing', () => {
    expect(() => saveSheet('u1', sampleSheet(), new Date(), memoryStore({ failWrites: true }))).not.toThrow();
  });

  it('forgets a copy on request', () => {
    const store = memoryStore();
    saveSheet('u1', sampleSheet('v1'), new Date(), store);
    forgetSheet('u1', 'v1', store);
    expect(readSheet('u1', 'v1', store)).toBeNull();
    expect(storedSheets('u1', store)).toEqual([]);
  });
});

describe('which leg sheet is shown', () => {
  const stored = { sheet: sampleSheet('v1'), savedAt: '2026-12-02T07:30:00.000Z' };
  const live = sampleSheet('v1');

  it("shows the server's answer whenever there is one", () => {
    expect(pickSheetSource({ data: live, error: null, fetchStatus: 'idle', stored }).kind).toBe('live');
  });

  it('falls back to the device copy when the network fails', () => {
    const s = pickSheetSource({ data: undefined, error: new ApiError(0, 'network', 'Could not reach the Loftline server.'), fetchStatus: 'idle', stored });
    expect(s).toMatchObject({ kind: 'offline', reason: 'unreachable', savedAt: stored.savedAt });
  });

  it('falls back to the device copy on a server error (5xx)', () => {
    expect(pickSheetSource({ data: undefined, error: new ApiError(503, 'db_down', 'down'), fetchStatus: 'idle', stored }).kind).toBe('offline');
  });

  it('shows the device copy while the browser is offline and the request waits', () => {
    expect(pickSheetSource({ data: undefined, error: null, fetchStatus: 'paused', stored })).toMatchObject({ kind: 'offline', reason: 'no-connection' });
  });

  it('shows the device copy at once while the first request is still on its way', () => {
    expect(pickSheetSource({ data: undefined, error: null, fetchStatus: 'fetching', stored })).toMatchObject({ kind: 'offline', reason: 'checking' });
  });

  it('never shows the device copy when the server refuses (403, 404): the user may no longer read it', () => {
    for (const status of [401, 403, 404]) {
      const error = new ApiError(status, 'forbidden', 'no');
      expect(pickSheetSource({ data: undefined, error, fetchStatus: 'idle', stored }).kind).toBe('error');
      expect(isRefusal(error)).toBe(true);
    }
  });

  it('waits for a connection when the sheet was never loaded on this device', () => {
    expect(pickSheetSource({ data: undefined, error: null, fetchStatus: 'paused', stored: null })).toEqual({ kind: 'loading', waitingForConnection: true });
    expect(pickSheetSource({ data: undefined, error: new ApiError(0, 'network', 'x'), fetchStatus: 'idle', stored: null }).kind).toBe('error');
  });
});
