// Accessibility checks with axe-core inside the test browser: inject the library into the
// page, run it on the whole document, keep the serious and critical violations, and print
// them so a failure says what to fix and where.
import fs from "node:fs";
import { createRequire } from "node:module";
import type { Page } from "playwright-core";

// Evaluated through the browser's debugging protocol rather than added as a <script>: the
// pages' Content-Security-Policy rightly refuses inline scripts without its nonce.
const axeSource = fs.readFileSync(createRequire(import.meta.url).resolve("axe-core/axe.min.js"), "utf8");

export interface AxeViolation {
  id: string;
  impact: string | null;
  help: string;
  helpUrl: string;
  nodes: { target: string[]; html: string; failureSummary: string }[];
}

const BLOCKING = new Set(["serious", "critical"]);

/** Serious and critical axe violations of the page as it is now. */
export async function seriousViolations(page: Page): Promise<AxeViolation[]> {
  if (!(await page.evaluate(() => "axe" in window))) await page.evaluate(axeSource);
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (context: Document, options: object) => Promise<{ violations: AxeViolation[] }> } }).axe;
    const result = await axe.run(document, { resultTypes: ["violations"] });
    return result.violations.map((v) => ({
      id: v.id,
      impact: v.impact,
      help: v.help,
      helpUrl: v.helpUrl,
      nodes: v.nodes.map((n) => ({ target: n.target.map(String), html: n.html, failureSummary: n.failureSummary })),
    }));
  });
  return violations.filter((v) => v.impact !== null && BLOCKING.has(v.impact));
}

/** A readable report: one block per rule, with the elements and axe's summary of each. */
export function describeViolations(where: string, violations: AxeViolation[]): string {
  if (violations.length === 0) return `${where}: no serious or critical accessibility violations`;
  const lines = [`${where}: ${violations.length} serious or critical accessibility violation(s)`];
  for (const v of violations) {
    lines.push(`- [${v.impact}] ${v.id}: ${v.help} (${v.helpUrl})`);
    for (const n of v.nodes.slice(0, 5)) {
      lines.push(`    at ${n.target.join(" ")}`);
      lines.push(`       ${n.html.replace(/\s+/g, " ").slice(0, 200)}`);
      for (const s of n.failureSummary.split("\n").slice(0, 4)) lines.push(`       ${s.trim()}`);
    }
    if (v.nodes.length > 5) lines.push(`    … and ${v.nodes.length - 5} more`);
  }
  return lines.join("\n");
}

/** Throws with the readable report when the page has serious or critical violations. */
export async function assertAccessible(page: Page, where: string): Promise<void> {
  const violations = await seriousViolations(page);
  if (violations.length > 0) throw new Error(describeViolations(where, violations));
}
