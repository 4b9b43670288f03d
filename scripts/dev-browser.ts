// `npm run dev:browser`: the real UI in any browser on this machine, against the real services.
// Serves dist/renderer (built by the npm script first) through the loopback harness with a fresh
// temp user-data folder, so a run never touches the desktop app's recovery copy or recent files.
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startHarness } from '../main/harness/server';

function argValue(name: string): string | undefined {
  const i = process.argv.indexOf(name);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

const portText = argValue('--port');
const port = portText === undefined ? 0 : Number(portText);
if (!Number.isInteger(port) || port < 0 || port > 65535) {
  console.error(`--port ${portText}: give a whole number from 0 to 65535.`);
  process.exit(2);
}

const given = argValue('--user-data');
const userDataDir = given ?? (await mkdtemp(join(tmpdir(), 'weighbridge-dev-')));
try {
  const harness = await startHarness({ port, userDataDir });
  console.log('Weighbridge in the browser (127.0.0.1 only).');
  console.log(`  Open:      ${harness.url}`);
  console.log(`  User data: ${userDataDir}${given === undefined ? ' (temporary, removed on exit)' : ''}`);
  console.log('  Files: type full paths on this machine into the path dialogs (there are no native dialogs here).');
  console.log('  Ctrl+C stops the server.');
  const stop = async () => {
    await harness.close();
    if (given === undefined) await rm(userDataDir, { recursive: true, force: true });
    process.exit(0);
  };
  process.once('SIGINT', () => void stop());
  process.once('SIGTERM', () => void stop());
} catch (error) {
  console.error(error instanceof Error ? error.message : String(error));
  process.exit(1);
}
