// The Python client (clients/python): `pip install ./clients/python` works without a network and
// its own tests (unittest) pass against a live service; the pandas paths run where Debian's
// python3-pandas is installed and are skipped, with a message, where it is not.
import { execFile } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import t from 'tap';
import { startLiveService } from './live-service.ts';
import { clientVenv, pythonClient } from './python-venv.ts';

const repositoryRoot = fileURLToPath(new URL('../../', import.meta.url));

const run = promisify(execFile);

t.test("the Python client's own tests pass against a live service", async (t) => {
  const python = await clientVenv(t);
  if (!python) return;
  const url = await startLiveService(t);
  const result = await run(python, ['-m', 'unittest', 'discover', '-v', '-s', 'tests'], {
    cwd: pythonClient, env: { ...process.env, PARSIMETRY_URL: url },
  }).catch((error: { stdout?: string; stderr?: string; code?: number }) => error);
  // unittest reports on stderr.
  const out = `${result.stdout ?? ''}${result.stderr ?? ''}`;
  const failed = 'code' in result && Boolean(result.code);
  t.notOk(failed, failed ? `the Python client's tests failed:\n${out}` : "the Python client's tests passed");
  const marker = await run(python, ['-c', 'import importlib.resources as r; print(r.files("parsimetry_client").joinpath("py.typed").is_file())'], { cwd: '/' });
  t.equal(marker.stdout.trim(), 'True', 'the installed package carries its py.typed marker');
  // The README's Python example, through the installed client (from the repository root, as documented).
  const example = await run(python, ['examples/fitted_elsewhere.py'], { cwd: repositoryRoot, env: { ...process.env, PARSIMETRY_URL: url } });
  t.match(example.stdout, /^1 {2}temperature-and-moisture .*\n2 {2}moisture-from-python /m, 'the example ranks both candidates');
  t.match(example.stdout, /record [0-9a-f-]{36}/);
  const ran = /Ran (\d+) tests?/.exec(out);
  t.ok(ran && Number(ran[1]) >= 18, `every test ran (${ran?.[1]})`);
  const skippedPandas = /skipped 'pandas is not installed[^']*'/.exec(out);
  if (skippedPandas) {
    console.error("\n*** The Python client's pandas paths were skipped: Debian's python3-pandas is not installed ***\n");
    t.comment('pandas paths skipped: python3-pandas is not installed');
  } else {
    t.match(out, /test_results_as_data_frames .* ok/, 'the pandas paths ran');
  }
});
