// @ts-check
/**
 * GDAL's gdal_grid is the peer the geostatistics bench is timed against. Like PostgreSQL in
 * scripts/lib/postgres.js, it is installed from Debian (gdal-bin) when missing and we are root;
 * otherwise the ratio is reported as not measured, with the reason, and the bench still runs.
 */
import { spawnSync } from 'node:child_process';
import { run } from './proc.js';
import { step, warn } from './log.js';

const APT_PACKAGE = 'gdal-bin';

export function gdalInstalled() {
	return spawnSync('gdal_grid', ['--version'], { encoding: 'utf8' }).status === 0;
}

/**
 * @param {{ install: boolean }} options install: false for a dry run, which changes nothing
 * @returns {Promise<string | null>} null when gdal_grid is there, else why it is not
 */
export async function ensureGdal({ install }) {
	if (gdalInstalled()) return null;
	const command = `apt-get update && DEBIAN_FRONTEND=noninteractive apt-get install -y ${APT_PACKAGE}`;
	if (!install) return `gdal_grid is not installed (a dry run installs nothing): ${command}`;
	if (typeof process.getuid !== 'function' || process.getuid() !== 0) {
		const reason = `gdal_grid is not installed; as root run: ${command}`;
		warn(`${reason} (GDAL ratios will be reported as not measured)`);
		return reason;
	}
	step(`installing ${APT_PACKAGE} with apt-get (GDAL's gdal_grid, the geostatistics peer)`);
	const code = await run('sh', ['-c', command], {
		env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' }
	});
	if (code !== 0) {
		const reason = `apt-get install ${APT_PACKAGE} failed (exit ${code})`;
		warn(`${reason}; GDAL ratios will be reported as not measured`);
		return reason;
	}
	return gdalInstalled() ? null : `${APT_PACKAGE} installed but gdal_grid still does not run`;
}
