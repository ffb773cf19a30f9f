/**
 * Accessibility checks in the browser tests: axe-core (the npm package, run inside the page)
 * over the page as it stands. Serious and critical violations fail the test; minor and
 * moderate ones are returned so a test can print them.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';
import { expect } from 'vitest';

const require = createRequire(import.meta.url);
const axeSource = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');

export interface A11yViolation {
  id: string;
  impact: string | null;
  help: string;
  /** CSS selectors of up to five offending elements */
  targets: string[];
}

export interface A11yReport {
  /** Serious and critical: these fail */
  blocking: A11yViolation[];
  /** Minor and moderate: listed, not failing */
  other: A11yViolation[];
}

/** Runs axe-core on the page (WCAG 2.0/2.1 A and AA rules and best practices). */
export async function auditA11y(page: Page): Promise<A11yReport> {
  const hasAxe = await page.evaluate(() => 'axe' in window);
  // Evaluated rather than added as a <script>: Cairn's Content-Security-Policy refuses inline
  // scripts, and an evaluation from the test is not subject to it.
  if (!hasAxe) await page.evaluate(axeSource);
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (...args: unknown[]) => Promise<unknown> } })
      .axe;
    const result = (await axe.run(document, {
      runOnly: {
        type: 'tag',
        values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'best-practice'],
      },
      resultTypes: ['violations'],
    })) as {
      violations: {
        id: string;
        impact: string | null;
        help: string;
        nodes: { target: unknown[] }[];
      }[];
    };
    return result.violations.map((v) => ({
      id: v.id,
      impact: v.impact,
      help: v.help,
      targets: v.nodes.slice(0, 5).map((n) => n.target.map(String).join(' ')),
    }));
  });
  const blocking = violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
  return { blocking, other: violations.filter((v) => !blocking.includes(v)) };
}

/** One line per violation, for a failure message or a log. */
export function describeViolations(violations: readonly A11yViolation[]): string {
  return violations
    .map((v) => `${v.impact ?? 'unknown'} ${v.id}: ${v.help} (${v.targets.join(', ')})`)
    .join('\n');
}

/** Fails the test when axe-core finds a serious or critical violation on the page as it is. */
export async function expectAccessible(page: Page): Promise<void> {
  const report = await auditA11y(page);
  expect(report.blocking, describeViolations(report.blocking)).toEqual([]);
}
