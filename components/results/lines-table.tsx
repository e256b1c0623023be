/** The flight lines: a sortable table on wide screens, a list of cards on phones; choosing a line shows its chart. */
import type { ReactNode, Ref } from 'react';
import { Pressable, StyleSheet, View, type PressableStateCallbackType } from 'react-native';
import type { UnitSystem } from '../../contracts/projects';
import { MarkerGlyph } from '../map/marker-glyph';
import { formatGsd, formatLength, formatPercent } from '../projects/units';
import { colors, layout, radii, space } from '../theme';
import { Text } from '../ui';
import type { LineRow, LineSortKey } from './line-rows';
import { statusLooks } from './station-status';

type WebPressState = PressableStateCallbackType & { hovered?: boolean; focused?: boolean };

type LinesTableProps = {
  rows: LineRow[];
  units: UnitSystem;
  sortKey: LineSortKey;
  sortDir: 'asc' | 'desc';
  onSort: (key: LineSortKey) => void;
  selected: number | null;
  onSelect: (index: number) => void;
  layout: 'table' | 'list';
  /** The attitude envelope in words when the overlaps are also given as guaranteed; null: as planned only. */
  envelope: string | null;
  /** In the list layout, what is shown right under the chosen line's card (its chart), and a ref to the pair. */
  selectedDetail?: ReactNode;
  selectedRef?: Ref<View>;
};

type Column = { key: LineSortKey; label: string; cell: (r: LineRow, u: UnitSystem) => string; flex: number };

const allColumns: Column[] = [
  { key: 'number', label: 'Line', cell: (r) => String(r.number), flex: 0.8 },
  { key: 'lengthM', label: 'Length', cell: (r, u) => formatLength(r.lengthM, u), flex: 1 },
  { key: 'photos', label: 'Photos', cell: (r) => String(r.photos), flex: 1 },
  { key: 'gsdMinCm', label: 'GSD min', cell: (r) => formatGsd(r.gsdMinCm, 2, 'min'), flex: 1 },
  { key: 'gsdMedianCm', label: 'GSD median', cell: (r) => formatGsd(r.gsdMedianCm), flex: 1 },
  { key: 'gsdMaxCm', label: 'GSD max', cell: (r) => formatGsd(r.gsdMaxCm, 2, 'max'), flex: 1 },
  // against the overlap targets: one decimal, rounded toward failing (79.8 % never shows as 80 %)
  { key: 'forwardOverlapMin', label: 'Fwd min', cell: (r) => formatPercent(r.forwardOverlapMin, 1, 'min'), flex: 1 },
  { key: 'sideOverlapMin', label: 'Side min', cell: (r) => formatPercent(r.sideOverlapMin, 1, 'min'), flex: 0.9 },
  // as guaranteed under the attitude envelope, beside the planned figures (only when the mission has an envelope)
  { key: 'forwardOverlapGuaranteedMin', label: 'Fwd guar.', cell: (r) => formatPercent(r.forwardOverlapGuaranteedMin, 1, 'min'), flex: 1.1 },
  { key: 'sideOverlapGuaranteedMin', label: 'Side guar.', cell: (r) => formatPercent(r.sideOverlapGuaranteedMin, 1, 'min'), flex: 1.1 },
  { key: 'aglMinM', label: 'AGL min', cell: (r, u) => formatLength(r.aglMinM, u, 0, 'min'), flex: 0.9 },
  { key: 'legs', label: 'Legs', cell: (r) => String(r.legs), flex: 0.7 },
  { key: 'warningCount', label: 'Warnings', cell: (r) => (r.warnings.length ? String(r.warnings.length) : '–'), flex: 1.2 },
];

function FlaggedNote({ row }: { row: LineRow }) {
  if (row.flagged === 0) {
    return (
      <View style={styles.flag}>
        <MarkerGlyph shape={statusLooks.meets.shape} color={statusLooks.meets.color} sizePx={12} />
        <Text variant="caption">all photos meet the targets</Text>
      </View>
    );
  }
  return (
    <View style={styles.flag}>
      <MarkerGlyph shape={statusLooks[row.worst].shape} color={statusLooks[row.worst].color} sizePx={12} />
      <Text variant="caption">
        {row.flagged} of {row.photos} photos off target (worst: {statusLooks[row.worst].label.toLowerCase()})
      </Text>
    </View>
  );
}

const guaranteedKeys: ReadonlyArray<LineSortKey> = ['forwardOverlapGuaranteedMin', 'sideOverlapGuaranteedMin'];

export function LinesTable(p: LinesTableProps) {
  if (p.layout === 'list') return <LinesList {...p} />;
  // without an envelope the overlaps are as planned only: no guaranteed columns
  const columns = p.envelope ? allColumns : allColumns.filter((c) => !guaranteedKeys.includes(c.key));
  return (
    <View role="table" aria-label="Flight lines" testID="lines-table" style={styles.table}>
      <View role="row" style={[styles.tr, styles.thead]}>
        {columns.map((c) => {
          const active = p.sortKey === c.key;
          return (
            <Pressable
              key={c.key}
              role="columnheader"
              aria-sort={active ? (p.sortDir === 'asc' ? 'ascending' : 'descending') : 'none'}
              aria-label={`${c.label}: sort`}
              onPress={() => p.onSort(c.key)}
              testID={`lines-sort-${c.key}`}
              style={(s: WebPressState) => [styles.th, { flex: c.flex }, (s.hovered || s.focused) && styles.thHover]}
            >
              <Text variant="caption" style={styles.thText}>
                {c.label}
                {active ? (p.sortDir === 'asc' ? ' ▲' : ' ▼') : ''}
              </Text>
            </Pressable>
          );
        })}
      </View>
      {p.rows.map((r) => {
        const selected = r.index === p.selected;
        return (
          <Pressable
            key={r.index}
            role="row"
            aria-selected={selected}
            onPress={() => p.onSelect(r.index)}
            testID={`line-row-${r.number}`}
            style={(s: WebPressState) => [styles.tr, styles.body, selected && styles.selected, !selected && (s.hovered || s.focused) && styles.hover]}
          >
            {columns.map((c) => (
              <View key={c.key} role="cell" style={[styles.td, { flex: c.flex }, c.key === 'number' && styles.numberCell]}>
                {c.key === 'number' ? <MarkerGlyph shape={statusLooks[r.worst].shape} color={statusLooks[r.worst].color} sizePx={13} /> : null}
                <Text variant={c.key === 'number' ? 'label' : 'caption'} aria-label={c.key === 'number' ? `Line ${r.number}, ${statusLooks[r.worst].label}` : undefined}>
                  {c.cell(r, p.units)}
                </Text>
              </View>
            ))}
          </Pressable>
        );
      })}
      <Text variant="caption" tone="muted" style={styles.tableNote} testID="lines-table-basis">
        {p.envelope ? `Forward and side minimums as planned, and as guaranteed under the attitude envelope (${p.envelope}).` : 'Overlaps as planned only: the mission has no attitude envelope.'}
      </Text>
    </View>
  );
}

function LinesList(p: LinesTableProps) {
  const sortChoices: { key: LineSortKey; label: string }[] = [
    { key: 'number', label: 'Order' },
    { key: 'gsdMaxCm', label: 'GSD max' },
    { key: 'sideOverlapMin', label: 'Side min' },
    ...(p.envelope ? [{ key: 'sideOverlapGuaranteedMin' as const, label: 'Side guar.' }] : []),
    { key: 'aglMinM', label: 'Lowest' },
    { key: 'warningCount', label: 'Warnings' },
  ];
  return (
    <View style={styles.listWrap} testID="lines-list">
      <View style={styles.sortRow} role="group" aria-label="Sort lines">
        <Text variant="caption" tone="muted">Sort:</Text>
        {sortChoices.map((c) => (
          <Pressable key={c.key} role="button" aria-pressed={p.sortKey === c.key} onPress={() => p.onSort(c.key)} testID={`lines-sort-${c.key}`} style={[styles.chip, p.sortKey === c.key && styles.chipOn]}>
            <Text variant="caption" tone={p.sortKey === c.key ? 'inverse' : 'default'}>
              {c.label}
              {p.sortKey === c.key ? (p.sortDir === 'asc' ? ' ▲' : ' ▼') : ''}
            </Text>
          </Pressable>
        ))}
      </View>
      <View role="list" aria-label="Flight lines">
        {p.rows.map((r) => {
          const selected = r.index === p.selected;
          return (
            // A list item holding a toggle button: the card is a control, and its pressed state says which line the chart shows.
            <View key={r.index} role="listitem" ref={selected ? p.selectedRef : undefined} style={styles.scrollTarget} testID={selected ? 'line-chosen' : undefined}>
            <Pressable role="button" aria-pressed={selected} onPress={() => p.onSelect(r.index)} testID={`line-row-${r.number}`} style={[styles.card, selected && styles.selected]}>
              <Text variant="bodyStrong">
                Line {r.number} · {formatLength(r.lengthM, p.units)} · {r.photos} photos · {r.legs} leg{r.legs === 1 ? '' : 's'}
              </Text>
              {selected ? (
                <>
                  <Text variant="caption">
                    GSD {formatGsd(r.gsdMinCm, 2, 'min')} / {formatGsd(r.gsdMedianCm)} / {formatGsd(r.gsdMaxCm, 2, 'max')} (min / median / max)
                  </Text>
                  <Text variant="caption">
                    Least overlap {formatPercent(r.forwardOverlapMin, 1, 'min')} forward, {formatPercent(r.sideOverlapMin, 1, 'min')} side as planned · lowest {formatLength(r.aglMinM, p.units, 0, 'min')} above ground
                  </Text>
                  <Text variant="caption" testID={`line-guaranteed-${r.number}`}>
                    {p.envelope
                      ? `As guaranteed under ${p.envelope}: ${formatPercent(r.forwardOverlapGuaranteedMin, 1, 'min')} forward, ${formatPercent(r.sideOverlapGuaranteedMin, 1, 'min')} side`
                      : 'Overlaps as planned only: the mission has no attitude envelope'}
                  </Text>
                </>
              ) : (
                // an unchosen line in one line of figures against the targets; choosing it shows them all and its chart
                <Text variant="caption" testID={`line-brief-${r.number}`}>
                  GSD up to {formatGsd(r.gsdMaxCm, 2, 'max')} · least overlap {formatPercent(r.forwardOverlapMin, 1, 'min')} / {formatPercent(r.sideOverlapMin, 1, 'min')}
                  {p.envelope ? ` (guaranteed ${formatPercent(r.forwardOverlapGuaranteedMin, 1, 'min')} / ${formatPercent(r.sideOverlapGuaranteedMin, 1, 'min')})` : ''} forward / side · lowest {formatLength(r.aglMinM, p.units, 0, 'min')} above ground
                </Text>
              )}
              <FlaggedNote row={r} />
              {/* each note is said once: in full with the line's chart, counted here */}
              {r.warnings.length ? (
                <Text variant="caption" tone="caution" testID={`line-notes-${r.number}`}>
                  ⚠ {r.warnings.length} note{r.warnings.length === 1 ? '' : 's'} on this line{selected ? ', listed with its chart below' : ': choose the line to read them'}
                </Text>
              ) : null}
            </Pressable>
            {selected ? p.selectedDetail : null}
            </View>
          );
        })}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  table: { borderWidth: layout.borderWidthPx, borderColor: colors.line, borderRadius: radii.md, overflow: 'hidden' },
  tableNote: { paddingHorizontal: space.xs, paddingVertical: space.sm },
  tr: { flexDirection: 'row', alignItems: 'center' },
  thead: { backgroundColor: colors.surfaceSunken, borderBottomWidth: layout.borderWidthPx, borderBottomColor: colors.lineStrong },
  th: { paddingHorizontal: space.xs, paddingVertical: space.sm, minHeight: layout.compactControlPx, justifyContent: 'center' },
  thHover: { backgroundColor: colors.line },
  thText: { fontWeight: '600' },
  body: { borderBottomWidth: layout.borderWidthPx, borderBottomColor: colors.line, minHeight: layout.compactControlPx, backgroundColor: colors.surface },
  td: { paddingHorizontal: space.xs, paddingVertical: space.xs },
  numberCell: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
  selected: { backgroundColor: colors.infoSoft, borderColor: colors.focus },
  hover: { backgroundColor: colors.surfaceSunken },
  flag: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
  listWrap: { gap: space.sm },
  sortRow: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.xs },
  chip: { paddingHorizontal: space.sm, paddingVertical: space.xs, borderRadius: radii.pill, borderWidth: layout.borderWidthPx, borderColor: colors.lineStrong, minHeight: layout.compactControlPx, justifyContent: 'center' },
  chipOn: { backgroundColor: colors.primary, borderColor: colors.primary },
  scrollTarget: { scrollMarginTop: space.sm } as object,
  card: { gap: space.xxs, padding: space.md, borderWidth: layout.borderWidthPx, borderColor: colors.line, borderRadius: radii.md, marginBottom: space.sm, backgroundColor: colors.surface },
});
