// A virtual environment of Debian's Python (/usr/bin/python3) with the Python client installed:
// `python3 -m venv` (Debian's python3-venv) with the system's site packages, so Debian's
// python3-wheel builds the package without a network (`pip install --no-build-isolation`; the venv
// brings setuptools) and Debian's python3-pandas is used where it is installed. .ci/run installs
// python3-venv and python3-wheel; missing, they fail the test in CI (CI=true) and skip it loudly
// elsewhere, as the PostgreSQL tests do.
import { execFile } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import type { Test } from 'tap';

const run = promisify(execFile);
const PYTHON = '/usr/bin/python3';
export const pythonClient = fileURLToPath(new URL('../../clients/python/', import.meta.url));

/** The venv's python with parsimetry_client installed, or null when the test was skipped (or failed). */
export async function clientVenv(t: Test): Promise<string | null> {
  const dir = mkdtempSync(join(tmpdir(), 'parsimetry-pyclient-'));
  t.teardown(() => rmSync(dir, { recursive: true, force: true }));
  try {
    await run(PYTHON, ['-m', 'venv', '--system-site-packages', join(dir, 'venv')]);
    await run(join(dir, 'venv', 'bin', 'python'), ['-c', 'import setuptools, wheel']);
  } catch (error) {
    const message = `a venv of ${PYTHON} with setuptools and wheel is unavailable (install Debian's python3-venv and python3-wheel): ${(error as Error).message.split('\n')[0]}`;
    if (process.env.CI === 'true') t.fail(message);
    else {
      console.error(`\n*** SKIPPING the Python client's tests: ${message} ***\n`);
      t.plan(0, message);
    }
    return null;
  }
  const python = join(dir, 'venv', 'bin', 'python');
  await run(python, ['-m', 'pip', 'install', '--quiet', '--no-index', '--no-build-isolation', '--disable-pip-version-check', pythonClient]);
  return python;
}
