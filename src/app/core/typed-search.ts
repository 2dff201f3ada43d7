import type { Signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { debounceTime, distinctUntilChanged, map, type Observable } from 'rxjs';

/** How long typing must pause before a search goes to the server. */
export const SEARCH_DEBOUNCE_MS = 300;

/**
 * Search text as people type it: trimmed, sent once typing pauses, and only when it changed,
 * so each keystroke does not become a request. Call in an injection context.
 */
export function typedSearch(text: Observable<string>): Signal<string> {
  return toSignal(
    text.pipe(
      map((t) => t.trim()),
      debounceTime(SEARCH_DEBOUNCE_MS),
      distinctUntilChanged(),
    ),
    { initialValue: '' },
  );
}
