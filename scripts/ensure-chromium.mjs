// First step of `npm test`: the browser test of the report needs Debian's `chromium` on PATH.
// Installs it with apt-get when it is missing and this runs as root; otherwise says how, and fails.
import { execFileSync, spawnSync } from 'node:child_process';

const onPath = (cmd) => spawnSync('sh', ['-c', `command -v ${cmd}`], { stdio: 'ignore' }).status === 0;

if (!onPath('chromium')) {
  if (process.getuid?.() === 0 && onPath('apt-get')) {
    console.log('chromium is missing (needed by the browser test of the report): installing Debian\'s chromium with apt-get');
    const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
    execFileSync('apt-get', ['update', '-q'], { stdio: 'inherit', env });
    execFileSync('apt-get', ['install', '-y', '-q', 'chromium'], { stdio: 'inherit', env });
  } else {
    console.error(
      'chromium is not installed and cannot be installed from here (needs root and apt-get).\n' +
        'Install it once with `sudo apt-get install -y chromium` (Debian/Ubuntu), then run `npm test` again.',
    );
    process.exit(1);
  }
}
