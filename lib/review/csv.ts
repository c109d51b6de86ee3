/**
 * One CSV cell. Text that a spreadsheet would run as a formula (it starts with =, +, -, @, a
 * tab or a carriage return) gets a leading apostrophe, whatever follows, so "-1+cmd|..." is
 * shown as text (issue 17). Numbers stay numbers. Quoted when it holds a comma, quote or line break.
 */
export function csvCell(value: unknown): string {
  if (typeof value === "number") return Number.isFinite(value) ? String(value) : "";
  const text = value === null || value === undefined ? "" : String(value);
  const safe = /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
  return /[",\n\r]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}
