/**
 * Fill and ink per material in stack pictures and legends, by colour index.
 * Theme tokens only, so light and dark mode both work; after the plain
 * colours the cycle repeats with hatching, so neighbours stay apart.
 */
const FILLS = [
  { fill: 'var(--mat-sys-primary)', ink: 'var(--mat-sys-on-primary)' },
  { fill: 'var(--mat-sys-tertiary)', ink: 'var(--mat-sys-on-tertiary)' },
  { fill: 'var(--mat-sys-secondary-container)', ink: 'var(--mat-sys-on-secondary-container)' },
  { fill: 'var(--mat-sys-tertiary-container)', ink: 'var(--mat-sys-on-tertiary-container)' },
  { fill: 'var(--mat-sys-primary-container)', ink: 'var(--mat-sys-on-primary-container)' },
  { fill: 'var(--mat-sys-surface-container-highest)', ink: 'var(--mat-sys-on-surface)' },
] as const;

export interface MaterialFill {
  fill: string;
  ink: string;
  hatched: boolean;
}

export function materialFill(colourIndex: number): MaterialFill {
  const base = FILLS[colourIndex % FILLS.length]!;
  return { ...base, hatched: Math.floor(colourIndex / FILLS.length) % 2 === 1 };
}
