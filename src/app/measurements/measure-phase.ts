import { signal } from '@angular/core';
import type { InterceptBody } from '../../../shared/measurements/measurements';

/** The phase part of an intercept request: a name, and V_V typed in or a saved point count's id. */
export type PhaseBody = { name: string; volumeFraction?: number; pointCountId?: string } | null;

/**
 * The two-phase choice on the measuring page: whether intercepts of one phase are counted, which phase,
 * and where its volume fraction comes from (a saved point count of the same place, or a typed value).
 */
export class MeasurePhase {
  readonly on = signal(false);
  readonly name = signal('');
  /** The saved point count that gives V_V, or '' to type V_V in. */
  readonly pointCountId = signal('');
  readonly typedFraction = signal(0.5);

  /** What the request carries: null for a single-phase count. */
  body(): PhaseBody {
    if (!this.on()) return null;
    const name = this.name().trim();
    return this.pointCountId() ? { name, pointCountId: this.pointCountId() } : { name, volumeFraction: this.typedFraction() };
  }

  /** Shows a saved definition's phase again. */
  restore(phase: InterceptBody['phase']): void {
    this.on.set(phase !== null);
    this.name.set(phase?.name ?? '');
    this.pointCountId.set(phase?.pointCountId ?? '');
    if (phase?.volumeFraction !== undefined) this.typedFraction.set(phase.volumeFraction);
  }
}
