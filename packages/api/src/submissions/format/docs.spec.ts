import { existsSync, readFileSync } from 'node:fs';
import { COLUMNS } from './columns.js';
import { renderExtractFormatDoc } from './docs.js';
import { ISSUE_CODES } from './issue-codes.js';
import { defaultLimits, docPath } from './write-docs.js';

describe('docs/extract-format.md', () => {
  const rendered = renderExtractFormatDoc(defaultLimits());

  it('is in step with the column definitions (run `npm run docs:extract-format` after a change)', () => {
    expect(existsSync(docPath)).toBe(true);
    expect(readFileSync(docPath, 'utf8')).toBe(rendered);
  });

  it('names every column and every issue code, and the default limits', () => {
    for (const def of COLUMNS) expect(rendered).toContain(`| \`${def.key}\` |`);
    for (const code of Object.keys(ISSUE_CODES)) expect(rendered).toContain(`| \`${code}\` |`);
    expect(rendered).toContain('at most 25 MB per file, 200,000 rows of data');
  });

  it('follows a change of limits rather than restating them', () => {
    const other = renderExtractFormatDoc({ ...defaultLimits(), maxRows: 1234 });
    expect(other).toContain('1,234 rows of data');
    expect(other).not.toBe(rendered);
  });

  it('escapes table cells so that a pipe in a definition cannot break a table', () => {
    for (const line of rendered.split('\n').filter((l) => l.startsWith('| `'))) {
      const unescaped = line.replace(/\\\|/g, '').split('|').length;
      const header = rendered
        .split('\n')
        .slice(0, rendered.split('\n').indexOf(line))
        .reverse()
        .find((l) => l.startsWith('|---'))!;
      expect(unescaped).toBe(header.split('|').length);
    }
  });
});
