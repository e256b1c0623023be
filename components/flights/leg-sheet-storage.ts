/** Offline copies of leg sheets in localStorage, one per user and version, so a loaded sheet stays readable without network. */
import { legSheetSchema, type LegSheet } from '../../contracts/flights';

type KeyValueStore = Pick<Storage, 'getItem' | 'setItem' | 'removeItem'>;

/** At most this many sheets are kept per device; the oldest copy goes first. */
export const maxStoredSheets = 12;

const prefix = 'loftline.legSheet';
const indexKey = `${prefix}.index`;

/** One remembered sheet as the index lists it (enough to offer it in the flights list while offline). */
export type StoredSheetEntry = { userId: string; versionId: string; title: string; savedAt: string };

export type StoredSheet = { sheet: LegSheet; savedAt: string };

/** localStorage key of one user's copy of one version's sheet. */
export function sheetKey(userId: string, versionId: string): string {
  return `${prefix}.${userId}.${versionId}`;
}

function browserStore(): KeyValueStore | null {
  try {
    return typeof window !== 'undefined' && window.localStorage ? window.localStorage : null;
  } catch {
    return null;
  }
}

function readIndex(store: KeyValueStore): StoredSheetEntry[] {
  try {
    const raw = JSON.parse(store.getItem(indexKey) ?? '[]');
    if (!Array.isArray(raw)) return [];
    return raw.filter(
      (e): e is StoredSheetEntry =>
        e && typeof e.userId === 'string' && typeof e.versionId === 'string' && typeof e.title === 'string' && typeof e.savedAt === 'string',
    );
  } catch {
    return [];
  }
}

/** Keeps `sheet` as the user's offline copy (newest first in the index); storage failures only cost the copy. */
export function saveSheet(userId: string, sheet: LegSheet, savedAt: Date = new Date(), store: KeyValueStore | null = browserStore()): void {
  if (!store) return;
  const versionId = sheet.version.id;
  const entry: StoredSheetEntry = {
    userId,
    versionId,
    title: `${sheet.version.planName} · version ${sheet.version.number} · ${sheet.version.projectName}`,
    savedAt: savedAt.toISOString(),
  };
  try {
    const others = readIndex(store).filter((e) => !(e.userId === userId && e.versionId === versionId));
    const index = [entry, ...others];
    for (const old of index.splice(maxStoredSheets)) store.removeItem(sheetKey(old.userId, old.versionId));
    store.setItem(sheetKey(userId, versionId), JSON.stringify({ savedAt: entry.savedAt, sheet }));
    store.setItem(indexKey, JSON.stringify(index));
  } catch {
    // Quota or privacy mode: the sheet still shows while the page is open.
  }
}

/** The user's copy of a version's sheet, or null when there is none or it no longer fits the contract. */
export function readSheet(userId: string, versionId: string, store: KeyValueStore | null = browserStore()): StoredSheet | null {
  if (!store) return null;
  try {
    const raw = JSON.parse(store.getItem(sheetKey(userId, versionId)) ?? 'null');
    if (!raw || typeof raw.savedAt !== 'string') return null;
    const parsed = legSheetSchema.safeParse(raw.sheet);
    return parsed.success ? { sheet: parsed.data, savedAt: raw.savedAt } : null;
  } catch {
    return null;
  }
}

/** Forgets a copy (the server said the version is gone or no longer the user's to read). */
export function forgetSheet(userId: string, versionId: string, store: KeyValueStore | null = browserStore()): void {
  if (!store) return;
  try {
    store.removeItem(sheetKey(userId, versionId));
    store.setItem(indexKey, JSON.stringify(readIndex(store).filter((e) => !(e.userId === userId && e.versionId === versionId))));
  } catch {
    // Nothing to do.
  }
}

/** The user's offline copies, newest first. */
export function storedSheets(userId: string, store: KeyValueStore | null = browserStore()): StoredSheetEntry[] {
  if (!store) return [];
  return readIndex(store).filter((e) => e.userId === userId);
}
