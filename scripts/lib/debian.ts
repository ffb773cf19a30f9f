/**
 * Installs the Debian packages Cairn needs when their program is missing:
 * mariadb-server (mariadbd), chromium and poppler-utils (pdftotext, for the
 * report checks). As root through apt-get; otherwise
 * a clear message naming the package.
 */
import { findExecutable, runInherit } from './proc.ts';
import { fail, log } from './log.ts';

let aptUpdated = false;

export async function ensureDebianPackage(
  program: string,
  pkg: string,
  why: string,
): Promise<string> {
  const found = findExecutable(program);
  if (found) return found;
  if (process.getuid?.() !== 0) {
    fail(
      `${program} is not installed (${why}). Install Debian's package "${pkg}" as root ` +
        `(sudo apt-get install -y ${pkg}) and run the command again.`,
    );
  }
  if (!findExecutable('apt-get')) {
    fail(
      `${program} is not installed and apt-get is not available: install "${pkg}" with this system's package manager.`,
    );
  }
  log.step(`installing Debian package ${pkg} (${why}) ...`);
  const started = Date.now();
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  const install = () => runInherit('apt-get', ['install', '-y', '-q', pkg], { env });
  let code = aptUpdated ? await install() : 1;
  if (code !== 0) {
    aptUpdated = true;
    await runInherit('apt-get', ['update', '-q'], { env });
    code = await install();
  }
  const installed = findExecutable(program);
  if (code !== 0 || !installed) {
    fail(`apt-get could not install ${pkg} (exit code ${code}); see the messages above.`);
  }
  log.ok(`installed ${pkg} in ${((Date.now() - started) / 1000).toFixed(0)} s`);
  return installed;
}
