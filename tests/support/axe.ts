import { createRequire } from 'node:module';
import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';

const require = createRequire(import.meta.url);
/** axe-core's browser build (plain JavaScript shipped in the npm package; nothing is downloaded). */
const AXE_SCRIPT = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');

/** One accessibility rule a page breaks, as axe-core reports it, trimmed to what a person needs to fix it. */
export interface AxeFinding {
  rule: string;
  impact: string;
  summary: string;
  targets: string[];
}

/**
 * Runs axe-core (the open-source accessibility rules engine) on the page as it stands and
 * returns its **serious** and **critical** violations, one entry per rule with the CSS
 * targets of the offending nodes (at most five per rule). The script is evaluated through the
 * browser's debugging protocol (Lagbook's Content-Security-Policy rightly refuses inline
 * script tags), once per document; running it again on the same document reuses it.
 */
export async function seriousAxeFindings(page: Page): Promise<AxeFinding[]> {
  const loaded = await page.evaluate<boolean>("typeof window.axe !== 'undefined'");
  if (!loaded) await page.evaluate(`${AXE_SCRIPT}\n;true`);
  // evaluated in the page as a string, so DOM and axe types stay out of the server-side type-check
  return page.evaluate<AxeFinding[]>(`(async () => {
    const result = await window.axe.run(document, { resultTypes: ['violations'] });
    return result.violations
      .filter((v) => v.impact === 'serious' || v.impact === 'critical')
      .map((v) => ({
        rule: v.id,
        impact: v.impact,
        summary: v.help,
        targets: v.nodes.slice(0, 5).map((n) => n.target.join(' ') + (n.failureSummary ? ' — ' + n.failureSummary.split('\\n').slice(1, 2).join('').trim() : '')),
      }));
  })()`);
}

/** The findings as readable lines: `rule (impact): summary` and one indented line per target. */
export function describeAxeFindings(findings: AxeFinding[]): string {
  return findings.map((f) => [`${f.rule} (${f.impact}): ${f.summary}`, ...f.targets.map((t) => `    at ${t}`)].join('\n')).join('\n');
}

/**
 * Fails with the readable list of serious or critical axe-core violations on the page, if
 * there are any; `where` names the page in the message.
 */
export async function expectNoSeriousAxeFindings(page: Page, where: string): Promise<void> {
  const findings = await seriousAxeFindings(page);
  if (findings.length > 0) throw new Error(`${where}: ${findings.length} serious or critical accessibility rule(s) broken:\n${describeAxeFindings(findings)}`);
}
