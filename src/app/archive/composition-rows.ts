import type { Composition } from '../../../shared/archive/composition';
import { isElementSymbol } from '../../../shared/archive/elements';

/** Analyses may round up a little; above this the listed contents are a typing error (as the server rules). */
export const COMPOSITION_SUM_LIMIT = 100.5;

/** One row of the composition editor: an element and its content in wt.%. */
export interface CompositionRow {
  element: string;
  wtPct: number | null;
}

/** The rows to edit, largest content first, as the formatted composition reads. */
export function compositionRows(composition: Composition): CompositionRow[] {
  return Object.entries(composition.wtPct)
    .sort((a, b) => b[1] - a[1])
    .map(([element, wtPct]) => ({ element, wtPct }));
}

/** Sum of the listed contents in wt.%, ignoring rows not filled in yet. */
export function listedSum(rows: readonly CompositionRow[]): number {
  return rows.reduce((sum, row) => sum + (row.wtPct !== null && Number.isFinite(row.wtPct) ? row.wtPct : 0), 0);
}

/** "23.21 wt.%": the live sum under the editor. */
export function formatSum(sum: number): string {
  return `${(Math.round(sum * 100) / 100).toFixed(2)} wt.%`;
}

/** The warning to show beside the sum, or null while it is plausible. */
export function sumWarning(sum: number): string | null {
  return sum > COMPOSITION_SUM_LIMIT
    ? `The listed contents add up to ${formatSum(sum)}, more than ${COMPOSITION_SUM_LIMIT} wt.%. Check for a typing error.`
    : null;
}

/** "Mn" for "mn " or "MN": people type symbols in any case; the archive stores them as IUPAC writes them. */
export function normaliseSymbol(text: string): string {
  const t = text.trim();
  return t.length === 0 ? '' : t[0]!.toUpperCase() + t.slice(1).toLowerCase();
}

/** Elements listed more than once (after normalising the case). */
export function repeatedElements(rows: readonly CompositionRow[]): Set<string> {
  const seen = new Set<string>();
  const repeated = new Set<string>();
  for (const row of rows) {
    const symbol = normaliseSymbol(row.element);
    if (!symbol) continue;
    if (seen.has(symbol)) repeated.add(symbol);
    seen.add(symbol);
  }
  return repeated;
}

/** A problem with one symbol as typed, or null when it is a chemical element. */
export function symbolProblem(text: string): string | null {
  const symbol = normaliseSymbol(text);
  if (!symbol) return 'Enter an element symbol.';
  return isElementSymbol(symbol) ? null : `${text.trim()} is not a chemical element symbol.`;
}

/** The composition to send: rows with a symbol and a content; `balance` '' means none. */
export function compositionFromRows(rows: readonly CompositionRow[], balance: string): Composition {
  const wtPct: Record<string, number> = {};
  for (const row of rows) {
    const symbol = normaliseSymbol(row.element);
    if (symbol && row.wtPct !== null && Number.isFinite(row.wtPct)) wtPct[symbol] = row.wtPct;
  }
  return { wtPct, balance: balance ? balance : null };
}
