/**
 * Every action Cairn writes to the audit trail has words: the source is searched for the
 * dotted action names it appends, and each must be in ACTION_LABELS (the web shows the words).
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { ACTION_GROUP_LABELS, ACTION_LABELS, actionLabel } from './action-labels.js';

const SRC = join(dirname(fileURLToPath(import.meta.url)), '..');

function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return name === 'dev' ? [] : sourceFiles(path);
    return name.endsWith('.ts') && !name.endsWith('.spec.ts') ? [path] : [];
  });
}

const ACTION =
  /['`]((?:auth|user|membership|region|quarter|submission|demo|measure_set|report|review_case|mail|mail_recipient)\.[a-z_]+)['`]/g;

describe('audit trail action labels', () => {
  const written = new Set<string>();
  for (const file of sourceFiles(SRC)) {
    if (file.endsWith('action-labels.ts')) continue;
    for (const match of readFileSync(file, 'utf8').matchAll(ACTION)) {
      // a download's file name, not an action
      if (!match[1]!.endsWith('.json')) written.add(match[1]!);
    }
  }

  it('finds the actions the source writes', () => {
    expect(written.has('auth.sign_in')).toBe(true);
    expect(written.has('submission.confirmed')).toBe(true);
    expect(written.size).toBeGreaterThanOrEqual(20);
  });

  it.each([...written].sort())('%s has words', (action) => {
    expect(ACTION_LABELS[action]).toBeDefined();
    expect(ACTION_GROUP_LABELS[`${action.split('.')[0]}.`] ?? 'Other').not.toBe('');
  });

  it('words an action it does not know without hiding it', () => {
    expect(actionLabel('review.case_opened')).toBe('Other: review case opened');
    expect(actionLabel('auth.sign_in')).toBe('Signed in');
  });
});
