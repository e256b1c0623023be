/** The coverage document in words, shared by the screens, the report and its PDF: the spec, how views were counted, each item, areas and shares. */
import type { CoverageDocument } from './coverage';

type Item = CoverageDocument['compliance']['items'][number];

/** "≤ 2.5 cm GSD and ≥ 5 views in every cell", plus σ limits where the spec has them. */
export function specWords(spec: CoverageDocument['spec']): string {
  const parts = [`GSD ≤ ${spec.maxGsdCm} cm`, `≥ ${spec.minViews} views`];
  if (spec.maxSigmaVerticalM !== null) parts.push(`vertical σ ≤ ${spec.maxSigmaVerticalM} m`);
  if (spec.maxSigmaHorizontalM !== null) parts.push(`horizontal σ ≤ ${spec.maxSigmaHorizontalM} m`);
  if (spec.maxDirectionGapDeg !== null) parts.push(`seen from all round (no gap over ${spec.maxDirectionGapDeg}° between views ≥ ${spec.obliqueDeg}° from vertical)`);
  return `${parts.join(', ')} in every cell`;
}

/** How views were counted: under the attitude envelope (its figures) or at the planned attitude. */
export function basisWords(envelope: CoverageDocument['envelope']): string {
  if (!envelope) return 'Views counted at the planned attitude (the mission states no attitude envelope).';
  const wind = envelope.windMps > 0 ? `, wind ${envelope.windMps} m/s from ${envelope.windFromDeg}°${envelope.crabs ? ' (the aircraft crabs into it)' : ''}` : '';
  return `Guaranteed: a view counts only if the point stays in the photo at every attitude within ±${envelope.rollDeg}° roll and ±${envelope.pitchDeg}° pitch${wind}.`;
}

/** What an item asks, as a short title. */
export function itemTitle(item: Item['item'], spec: CoverageDocument['spec']): string {
  switch (item) {
    case 'gsd': return `Fine enough: a view at GSD ≤ ${spec.maxGsdCm} cm`;
    case 'views': return `Seen often enough: ≥ ${spec.minViews} views`;
    case 'sigma-vertical': return `Vertical σ ≤ ${spec.maxSigmaVerticalM} m (advisory)`;
    case 'sigma-horizontal': return `Horizontal σ ≤ ${spec.maxSigmaHorizontalM} m (advisory)`;
    case 'directions': return `Seen from all round: no gap over ${spec.maxDirectionGapDeg}° between views ≥ ${spec.obliqueDeg}° from vertical`;
    case 'ground-unknown': return 'Ground height known';
  }
}

/** 1234 m² → "1,234 m²"; 56,789 m² → "5.68 ha". */
export function areaWords(m2: number): string {
  if (m2 >= 10_000) return `${(m2 / 10_000).toFixed(2)} ha`;
  return `${Math.round(m2).toString().replace(/\B(?=(\d{3})+(?!\d))/g, ',')} m²`;
}

/** 0.684638 → "68.5 %" (never "100 %" unless every cell meets it). */
export function shareWords(share: number): string {
  const pct = share * 100;
  if (share < 1 && pct > 99.9) return '> 99.9 %';
  if (share > 0 && pct < 0.1) return '< 0.1 %';
  return `${pct.toFixed(1)} %`;
}
