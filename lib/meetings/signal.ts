import "server-only";
import { EventEmitter } from "node:events";

/**
 * Wakes the open meeting streams of this server process at once when a meeting changes, so
 * members' pages follow without waiting for the next poll. The streams still poll the
 * meeting's revision (another process, a missed signal), so this is a shortcut, not the record.
 */
const key = Symbol.for("visviva.meeting-signal");
const holder = globalThis as unknown as Record<symbol, EventEmitter | undefined>;
const emitter = (holder[key] ??= Object.assign(new EventEmitter(), {})).setMaxListeners(0);

export function signalMeeting(callId: string): void {
  emitter.emit(callId);
}

/** Calls `listener` whenever the call's meeting changes in this process; returns the unsubscribe. */
export function onMeetingSignal(callId: string, listener: () => void): () => void {
  emitter.on(callId, listener);
  return () => emitter.off(callId, listener);
}
