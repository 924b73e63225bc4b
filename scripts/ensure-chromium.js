// End-to-end tests drive Debian's Chromium (no browser download is possible here).
// Installs it when missing and we are root on a Debian-like machine; otherwise explains.
import { existsSync } from 'node:fs';
import { execSync } from 'node:child_process';

const path = process.env.CHROMIUM_PATH || '/usr/bin/chromium';
if (!existsSync(path)) {
	const root = typeof process.getuid === 'function' && process.getuid() === 0;
	if (root && existsSync('/usr/bin/apt-get')) {
		console.log('Chromium is missing: installing Debian package "chromium"…');
		execSync(
			'apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium',
			{
				stdio: 'inherit'
			}
		);
	} else {
		console.error(
			`Chromium not found at ${path}. Install it (Debian: apt-get install chromium) or set CHROMIUM_PATH.`
		);
		process.exit(1);
	}
}
