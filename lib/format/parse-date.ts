// Reads a date as people type it into a form, always in UTC (the product's one zone, see
// dates.ts): "12 Dec 2026", "12 December 2026 14:00", "Dec 12, 2026", "2026-12-12",
// "2026-12-12 09:30 UTC", "12/12/2026" (day first, as written outside the US) and full ISO
// 8601 timestamps. Without a time, a start means the start of that day and an end the last
// minute of it. Pure: runs in the browser and on the server.

const MONTHS = ["january", "february", "march", "april", "may", "june", "july", "august", "september", "october", "november", "december"];

export type DateEdge = "start" | "end";

export type ParsedDate = { ok: true; date: Date } | { ok: false; error: string };

const HINT = 'Write a date such as "12 Dec 2026" or "2026-12-12", optionally with a time such as "14:00" (UTC).';

/** "Dec", "dec.", "December", "sept" → 11 / 8; anything else → -1. */
function monthIndex(word: string): number {
  const w = word.toLowerCase().replace(/\.$/, "");
  if (w.length < 3) return -1;
  return MONTHS.findIndex((m) => m.startsWith(w));
}

function build(year: number, month: number, day: number, time: { h: number; m: number } | null, edge: DateEdge): ParsedDate {
  if (year < 1970 || year > 2200) return { ok: false, error: `The year ${year} is out of range. ${HINT}` };
  if (month < 0 || month > 11) return { ok: false, error: `There is no month ${month + 1}. ${HINT}` };
  const date = new Date(Date.UTC(year, month, day, time ? time.h : edge === "end" ? 23 : 0, time ? time.m : edge === "end" ? 59 : 0));
  if (date.getUTCDate() !== day || date.getUTCMonth() !== month) return { ok: false, error: `${day} is not a day of that month. ${HINT}` };
  return { ok: true, date };
}

/** Parses `text` as a UTC date (and optional time). `edge` says which end of a bare day is meant. */
export function parseWrittenDate(text: string, edge: DateEdge = "start"): ParsedDate {
  const raw = text.trim();
  if (!raw) return { ok: false, error: `Enter a date. ${HINT}` };
  if (raw.length > 60) return { ok: false, error: `That is too long for a date. ${HINT}` };
  // Full ISO 8601 with a zone (what API clients send).
  if (/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})$/i.test(raw)) {
    const d = new Date(raw);
    return Number.isNaN(d.getTime()) ? { ok: false, error: `That is not a valid date. ${HINT}` } : { ok: true, date: d };
  }
  let rest = raw.replace(/\s*(utc|z|gmt)$/i, "").trim();
  let time: { h: number; m: number } | null = null;
  const t = /(?:,|\s|T)\s*(\d{1,2}):(\d{2})$/i.exec(rest);
  if (t) {
    const h = Number(t[1]);
    const m = Number(t[2]);
    if (h > 23 || m > 59) return { ok: false, error: `${t[1]}:${t[2]} is not a time of day. ${HINT}` };
    time = { h, m };
    rest = rest.slice(0, t.index).trim().replace(/,$/, "");
  }
  let m: RegExpExecArray | null;
  if ((m = /^(\d{4})-(\d{1,2})-(\d{1,2})$/.exec(rest))) return build(Number(m[1]), Number(m[2]) - 1, Number(m[3]), time, edge);
  if ((m = /^(\d{1,2})[/.](\d{1,2})[/.](\d{4})$/.exec(rest))) return build(Number(m[3]), Number(m[2]) - 1, Number(m[1]), time, edge);
  if ((m = /^(\d{1,2})\s+([a-z.]+),?\s+(\d{4})$/i.exec(rest))) {
    const month = monthIndex(m[2]!);
    if (month < 0) return { ok: false, error: `"${m[2]}" is not a month. ${HINT}` };
    return build(Number(m[3]), month, Number(m[1]), time, edge);
  }
  if ((m = /^([a-z.]+)\s+(\d{1,2}),?\s+(\d{4})$/i.exec(rest))) {
    const month = monthIndex(m[1]!);
    if (month < 0) return { ok: false, error: `"${m[1]}" is not a month. ${HINT}` };
    return build(Number(m[3]), month, Number(m[2]), time, edge);
  }
  return { ok: false, error: `"${raw}" is not a date we can read. ${HINT}` };
}
