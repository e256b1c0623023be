/**
 * The as-flown card's state: the version's checks (newest shown unless another is chosen), and a new check from
 * picked files: read on the device (photos' metadata or a CSV log), then only the records sent to be checked.
 */
import { useState } from 'react';
import type { AsFlownCheck, AsFlownCheckSummary } from '../../contracts/as-flown';
import { can } from '../../contracts/roles';
import { errorMessage } from '../api/api-error';
import { useCurrentTeam } from '../team/current-team-context';
import { useAsFlownCheckQuery, useAsFlownChecksQuery, useCreateAsFlownCheck } from './as-flown.queries';

type CheckPhase =
  | { kind: 'idle' }
  | { kind: 'reading'; done: number; total: number }
  | { kind: 'sending'; count: number }
  | { kind: 'failed'; message: string };

export interface AsFlownCardState {
  mayCheck: boolean;
  offline: boolean;
  phase: CheckPhase;
  /** What the last read left out or assumed (shown under the result). */
  readNotes: string[];
  checks: AsFlownCheckSummary[] | undefined;
  listError: string | null;
  selectedId: string | null;
  select: (id: string) => void;
  shown: AsFlownCheck | undefined;
  shownLoading: boolean;
  pick: (files: File[]) => void;
}

export function useAsFlownCheck(versionId: string, opts: { offline: boolean }): AsFlownCardState {
  const { team, role } = useCurrentTeam();
  const teamId = team?.id;
  const [phase, setPhase] = useState<CheckPhase>({ kind: 'idle' });
  const [readNotes, setReadNotes] = useState<string[]>([]);
  const [chosen, setChosen] = useState<string | null>(null);
  const list = useAsFlownChecksQuery(teamId, versionId, !opts.offline);
  const create = useCreateAsFlownCheck(teamId, versionId);
  const checks = list.data?.checks;
  const selectedId = chosen ?? checks?.[0]?.id ?? null;
  const one = useAsFlownCheckQuery(teamId, versionId, selectedId);

  async function pick(files: File[]) {
    setReadNotes([]);
    setPhase({ kind: 'reading', done: 0, total: files.length });
    try {
      // the EXIF reader loads only when photos are picked, not with the sheet
      const { readPhotoFiles } = await import('./read-photo-files');
      // the count on screen moves at most ten times a second: a render per photo would slow the reading down
      let shownAt = 0;
      const reading = await readPhotoFiles(files, (done, total) => {
        const now = Date.now();
        if (done === total || now - shownAt >= 100) {
          shownAt = now;
          setPhase({ kind: 'reading', done, total });
        }
      });
      const notes = [...reading.skipped];
      if (reading.assumedCount) notes.push(`${reading.assumedCount} photo${reading.assumedCount === 1 ? ' states' : 's state'} no full camera attitude: looking straight down along the line is assumed for ${reading.assumedCount === 1 ? 'it' : 'them'}.`);
      setReadNotes(notes);
      setPhase({ kind: 'sending', count: reading.photos.length });
      const check = await create.mutateAsync({ source: reading.source, label: reading.label, photos: reading.photos });
      setChosen(check.id);
      setPhase({ kind: 'idle' });
    } catch (err) {
      setPhase({ kind: 'failed', message: errorMessage(err) });
    }
  }

  return {
    mayCheck: can(role, 'flight:check'),
    offline: opts.offline,
    phase,
    readNotes,
    checks,
    listError: list.error ? errorMessage(list.error) : null,
    selectedId,
    select: setChosen,
    shown: one.data,
    shownLoading: one.isLoading && selectedId !== null,
    pick: (files) => void pick(files),
  };
}
