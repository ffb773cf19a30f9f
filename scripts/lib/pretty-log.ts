/**
 * Turns the API's JSON log lines into short readable lines for the terminal
 * of `npm start`, and keeps the full JSON in .data/log/<name>.log.
 */
import { createWriteStream, mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import type { Readable } from 'node:stream';
import { createInterface } from 'node:readline';

const levels: Record<number, string> = {
  10: 'trace',
  20: 'debug',
  30: 'info',
  40: 'WARN',
  50: 'ERROR',
  60: 'FATAL',
};
const quietContexts = new Set([
  'RoutesResolver',
  'RouterExplorer',
  'InstanceLoader',
  'NestFactory',
]);

export function formatLogLine(name: string, line: string): string | null {
  let entry: Record<string, unknown>;
  try {
    entry = JSON.parse(line) as Record<string, unknown>;
  } catch {
    return line.trim() ? `${name} | ${line}` : null;
  }
  const level = typeof entry.level === 'number' ? entry.level : 30;
  if (level < 40 && quietContexts.has(String(entry.context))) return null;
  const time =
    typeof entry.time === 'string'
      ? entry.time.slice(11, 19)
      : new Date().toISOString().slice(11, 19);
  if (entry.method && entry.path) {
    return `${name} | ${time} ${entry.method} ${entry.path} ${entry.status} ${entry.ms} ms`;
  }
  const tag = level >= 40 ? ` ${levels[level] ?? level}` : '';
  const context = entry.context ? ` [${entry.context}]` : '';
  return `${name} | ${time}${tag}${context} ${String(entry.msg ?? '')}`;
}

export function pipeLogs(name: string, stream: Readable, file: string, verbose: boolean): void {
  mkdirSync(dirname(file), { recursive: true });
  const out = createWriteStream(file, { flags: 'a' });
  const lines = createInterface({ input: stream });
  lines.on('line', (line) => {
    out.write(line + '\n');
    const pretty = formatLogLine(name, line);
    if (pretty === null) return;
    if (!verbose && / GET \/api\/health 200 /.test(pretty)) return;
    console.log(pretty);
  });
}
