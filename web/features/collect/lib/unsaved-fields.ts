/**
 * Fields whose typed text could not be saved (not a number, out of range): kept here, not in the
 * outbox, so the page never says "All changes saved" while one exists, the text survives moving
 * between strips, and leaving the page asks first.
 */
import { useSyncExternalStore } from 'react';

export interface UnsavedField {
  key: string;
  siteId: string;
  stripId: string;
  /** Where it is, in words: "Plot 203, Count 2". */
  place: string;
  text: string;
  /** Why it was not saved. */
  message: string;
}

const fields = new Map<string, UnsavedField>();
let snapshot: UnsavedField[] = [];
const listeners = new Set<() => void>();

function changed() {
  snapshot = [...fields.values()];
  for (const listener of listeners) listener();
}

export function fieldKey(stripId: string, field: string, index?: number): string {
  return `${stripId}:${field}:${index ?? ''}`;
}

export function markUnsaved(field: UnsavedField): void {
  const old = fields.get(field.key);
  if (old && old.text === field.text && old.message === field.message) return;
  fields.set(field.key, field);
  changed();
}

export function clearUnsaved(key: string): void {
  if (fields.delete(key)) changed();
}

/** The text of a field that was not saved, to show it again when the field comes back. */
export function unsavedField(key: string): UnsavedField | undefined {
  return fields.get(key);
}

function subscribe(listener: () => void) {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

/** Fields not saved, on one site or everywhere. */
export function useUnsavedFields(siteId?: string): UnsavedField[] {
  const all = useSyncExternalStore(
    subscribe,
    () => snapshot,
    () => snapshot,
  );
  return siteId ? all.filter((f) => f.siteId === siteId) : all;
}

if (typeof window !== 'undefined') {
  // The browser shows its own "Leave site?" question; the text of the event is not shown.
  window.addEventListener('beforeunload', (event) => {
    if (fields.size === 0) return;
    event.preventDefault();
    event.returnValue = '';
  });
}
