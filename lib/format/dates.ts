// The one way VisViva writes dates and times, on every page, letter and e-mail: day, short
// month name and year, a 24-hour clock, always in UTC and always saying so
// ("2 Dec 2026, 14:52 UTC"). Boards meet across time zones and orbit data runs on UTC, so no
// reader's local zone is ever used. Built by hand rather than with Intl so the server and every
// browser print exactly the same characters (no hydration differences between ICU versions).
// Pure: runs unchanged in the browser and on the server.

const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"] as const;

export const TIME_ZONE_LABEL = "UTC";

type DateInput = Date | string | number;

function toDate(value: DateInput): Date | null {
  const date = value instanceof Date ? value : new Date(value);
  return Number.isNaN(date.getTime()) ? null : date;
}

const pad = (n: number) => String(n).padStart(2, "0");

function day(date: Date): string {
  return `${date.getUTCDate()} ${MONTHS[date.getUTCMonth()]} ${date.getUTCFullYear()}`;
}

/** "2 Dec 2026, 14:52 UTC". */
export function formatDateTime(value: DateInput): string {
  const date = toDate(value);
  if (!date) return "unknown date";
  return `${day(date)}, ${pad(date.getUTCHours())}:${pad(date.getUTCMinutes())} ${TIME_ZONE_LABEL}`;
}

/** "2 Dec 2026 (UTC)": for values where the hour does not matter (member since, a day's list). */
export function formatDate(value: DateInput): string {
  const date = toDate(value);
  if (!date) return "unknown date";
  return `${day(date)} (${TIME_ZONE_LABEL})`;
}

/** "14:52:07 UTC": the time of something that happened today, such as the last autosave. */
export function formatTime(value: DateInput): string {
  const date = toDate(value);
  if (!date) return "unknown time";
  return `${pad(date.getUTCHours())}:${pad(date.getUTCMinutes())}:${pad(date.getUTCSeconds())} ${TIME_ZONE_LABEL}`;
}

/**
 * A wait in words, rounded as a person would say it: "in under a minute", "in about a minute",
 * "in about 15 minutes" (887 s), "in about 2 hours", "in about 3 days".
 */
export function formatWait(seconds: number): string {
  if (!Number.isFinite(seconds) || seconds < 60) return "in under a minute";
  const minutes = Math.round(seconds / 60);
  if (minutes < 90) return minutes === 1 ? "in about a minute" : `in about ${minutes} minutes`;
  const hours = Math.round(seconds / 3600);
  if (hours < 36) return `in about ${hours} hours`;
  return `in about ${Math.round(seconds / 86400)} days`;
}
