import { computed, Signal, signal } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { catchError, map, Observable, of, switchMap } from 'rxjs';
import { apiErrorMessage } from './api-error-message';

/** Server data a view shows, with the loading and error states it must render. */
export interface Remote<T> {
  readonly value: Signal<T | undefined>;
  readonly loading: Signal<boolean>;
  /** The server's sentence when the last load failed, else null. */
  readonly error: Signal<string | null>;
  /** Loads again with the same parameters (after a mutation, or "Try again"). */
  reload(): void;
  /** Replaces the value with one the server just returned (e.g. from a PATCH). */
  set(value: T): void;
}

interface State<T> {
  value: T | undefined;
  loading: boolean;
  error: string | null;
}

/**
 * Loads `load(params())` whenever the parameters change, cancelling the
 * request in flight. The last value stays visible while the next one loads,
 * so tables do not flash empty between pages. Call in an injection context.
 * (A stable stand-in for the still experimental `rxResource`.)
 */
export function remote<P, T>(params: () => P, load: (params: P) => Observable<T>): Remote<T> {
  const state = signal<State<T>>({ value: undefined, loading: true, error: null });
  const attempt = signal(0);
  const request = computed(() => ({ params: params(), attempt: attempt() }));

  toObservable(request)
    .pipe(
      switchMap(({ params: current }) => {
        state.update((s) => ({ ...s, loading: true, error: null }));
        return load(current).pipe(
          map((value): State<T> => ({ value, loading: false, error: null })),
          catchError((error: unknown) =>
            of<State<T>>({ value: undefined, loading: false, error: messageOf(error) }),
          ),
        );
      }),
      takeUntilDestroyed(),
    )
    .subscribe((next) => state.set(next));

  return {
    value: computed(() => state().value),
    loading: computed(() => state().loading),
    error: computed(() => state().error),
    reload: () => attempt.update((n) => n + 1),
    set: (value: T) => state.set({ value, loading: false, error: null }),
  };
}

function messageOf(error: unknown): string {
  if (typeof error === 'object' && error !== null && 'status' in error) {
    return apiErrorMessage(error as { status: number; error: unknown }).message;
  }
  return 'Something went wrong while loading. Try again.';
}
