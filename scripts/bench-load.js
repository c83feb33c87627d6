// @ts-check
/**
 * `npm run bench:load`: the production build under concurrent load, on its own services (the
 * `bench` profile: storage/bench, its own ports) with the demo scenario plus a large number of
 * invented public sites. Three routes are loaded one after another with autocannon (50
 * connections for 60 s each by default): the map's data route (/api/v1/sites.geojson for a map
 * view's bbox), a site page, and the sites API with filters over the whole region. Then a soak
 * runs all three together while the app's resident memory (RSS) is sampled, and says whether it
 * stayed flat. Then the items endpoints (OGC API – Features all-sites items and /api/v1/sites, one
 * page of 100) run at 10 and at 50 connections. Any error, timeout or non-2xx answer fails the run.
 * Results are printed and written to bench/results/load.json. Like `npm run bench`, speed is
 * judged here, never in tests.
 *
 * `--url` loads an app that is already running instead (`npm start`, with the large scenario of
 * `npm run seed:large`): nothing is started or seeded, the targets are read from its database
 * (the start profile's), the map's data route is /api/v1/map for a zoomed-in view of the largest
 * public area and the sites API is the paged /api/v1/sites.
 */
import fs from 'node:fs';
import path from 'node:path';
import { ROOT, resolveConfig } from './lib/config.js';
import { fatal, ok, step, warn } from './lib/log.js';
import { orchestrate } from './lib/orchestrator.js';
import { claimRun } from './lib/runstate.js';

const USAGE = `usage: npm run bench:load [-- options]

  --duration S     seconds per route (default 60)
  --soak S         seconds of the memory soak with all routes (default 300; 0 skips it)
  --connections N  concurrent connections (default 50)
  --sites N        invented public sites added to the demo data (default 20000)
  --items S        seconds per items run (OGC and REST, 10 and 50 connections; default 30; 0 skips)
  --url URL        load this running app (npm start, e.g. with npm run seed:large) instead
  --quick          a short run: --duration 10 --soak 30 --items 10
  --out FILE       where the JSON results go (default bench/results/load.json)`;

/** @param {string[]} argv */
function parseArgs(argv) {
	const args = {
		duration: 60,
		soak: 300,
		connections: 50,
		sites: 20_000,
		items: 30,
		/** @type {string | null} */
		url: null,
		out: path.join(ROOT, 'bench/results/load.json')
	};
	for (let i = 0; i < argv.length; i++) {
		const a = argv[i];
		const number = () => {
			const v = Number(argv[++i]);
			if (!Number.isInteger(v) || v < 0) usage(`${a} needs a whole number`);
			return v;
		};
		if (a === '--help' || a === '-h') {
			console.log(USAGE);
			process.exit(0);
		} else if (a === '--duration') args.duration = Math.max(1, number());
		else if (a === '--soak') args.soak = number();
		else if (a === '--connections') args.connections = Math.max(1, number());
		else if (a === '--sites') args.sites = number();
		else if (a === '--items') args.items = number();
		else if (a === '--url') {
			const u = argv[++i] ?? usage('--url needs an address');
			if (!/^https?:\/\/[^/]+$/.test(u.replace(/\/$/, ''))) usage('--url needs http://host:port');
			args.url = u.replace(/\/$/, '');
		} else if (a === '--quick') Object.assign(args, { duration: 10, soak: 30, items: 10 });
		else if (a === '--out') args.out = path.resolve(argv[++i] ?? usage('--out needs a file'));
		else usage(`unknown option ${a}`);
	}
	return args;
}

/** @param {string} message @returns {never} */
function usage(message) {
	console.error(`${message}\n\n${USAGE}`);
	process.exit(2);
}

/** The items endpoints: one page of 100 of all visible sites, through OGC API – Features and REST. */
const ITEMS = [
	{
		name: 'OGC items (/ogc/collections/sites/items)',
		path: '/ogc/collections/sites/items?limit=100'
	},
	{ name: 'REST items (/api/v1/sites)', path: '/api/v1/sites?limit=100' }
];

const args = parseArgs(process.argv.slice(2));

await orchestrate(async () => {
	const { ensureNodeModules } = await import('./lib/deps.js');
	await ensureNodeModules();
	const { rssOf, runLoad, summariseRss } = await import('./lib/bench-load.js');
	const setup = args.url ? await runningApp(args.url) : await ownApp();
	const { base, appPid, routes, items, data } = setup;
	// One request of each first: a route that fails at all fails fast, before minutes of load.
	for (const r of [...routes, ...items]) {
		const res = await fetch(base + r.path);
		if (!res.ok) fatal(`${r.path} answered ${res.status} before the load started`);
		await res.arrayBuffer();
	}

	const results = [];
	for (const r of routes) {
		step(`${r.name}: ${args.connections} connections for ${args.duration} s`);
		results.push({
			...r,
			...(await runLoad({
				url: base + r.path,
				connections: args.connections,
				duration: args.duration
			}))
		});
	}

	let soak = null;
	if (args.soak > 0) {
		step(
			`soak: all three routes, ${args.connections} connections for ${args.soak} s, sampling the app's RSS`
		);
		/** @type {{ t: number, rssMB: number }[]} */
		const samples = [];
		const started = Date.now();
		if (appPid === null) warn("the app's process is not known here: its memory is not sampled");
		const sample = () => {
			const rss = appPid === null ? null : rssOf(appPid);
			if (rss !== null) samples.push({ t: (Date.now() - started) / 1000, rssMB: rss });
		};
		sample();
		const timer = setInterval(sample, 2000);
		try {
			const load = await runLoad({
				url: base,
				connections: args.connections,
				duration: args.soak,
				requests: routes.map((r) => ({ method: 'GET', path: r.path }))
			});
			soak = { ...load, rss: summariseRss(samples), samples };
		} finally {
			clearInterval(timer);
		}
	}

	/** @type {any[]} */
	const itemResults = [];
	if (args.items > 0)
		for (const r of items)
			for (const connections of [10, 50]) {
				step(`${r.name}: ${connections} connections for ${args.items} s`);
				itemResults.push({
					...r,
					connections,
					...(await runLoad({ url: base + r.path, connections, duration: args.items }))
				});
			}

	const { loadavg, cpus } = await import('node:os');
	const report = {
		at: new Date().toISOString(),
		machine: `${cpus().length} × ${cpus()[0]?.model ?? 'CPU'}, Node ${process.version}`,
		loadAverageAtEnd: loadavg()[0],
		data,
		connections: args.connections,
		durationS: args.duration,
		routes: results,
		items: itemResults,
		soak: soak && { ...soak, samples: undefined, sampleCount: soak.samples.length }
	};
	fs.mkdirSync(path.dirname(args.out), { recursive: true });
	fs.writeFileSync(
		args.out,
		JSON.stringify({ ...report, soakSamples: soak?.samples ?? [] }, null, '\t')
	);

	console.log('');
	console.log(
		`load on ${report.machine}; 1-minute load average ${report.loadAverageAtEnd.toFixed(2)} at the end`
	);
	console.log('| route | requests | req/s | p50 | p99 | errors |');
	console.log('| --- | ---: | ---: | ---: | ---: | ---: |');
	for (const r of [...results, ...(soak ? [{ name: 'soak (all three)', ...soak }] : [])]) {
		console.log(
			`| ${r.name} | ${r.requests} | ${r.rps.toFixed(0)} | ${r.p50} ms | ${r.p99} ms | ${r.failures} |`
		);
	}
	if (itemResults.length) {
		console.log('');
		console.log(
			'| items endpoint (one page of 100) | connections | requests | req/s | p50 | p99 | errors |'
		);
		console.log('| --- | ---: | ---: | ---: | ---: | ---: | ---: |');
		for (const r of itemResults)
			console.log(
				`| ${r.name} | ${r.connections} | ${r.requests} | ${r.rps.toFixed(0)} | ${r.p50} ms | ${r.p99} ms | ${r.failures} |`
			);
	}
	if (soak) {
		const m = soak.rss;
		console.log(
			`RSS during the soak: ${m.firstMB} MB at the start, ${m.lastMB} MB at the end, peak ${m.maxMB} MB; ` +
				`median ${m.earlyMedianMB} MB in the first third after warm-up, ${m.lateMedianMB} MB in the last third: ${m.flat ? 'flat' : 'GROWING'}`
		);
	}
	ok(`results written to ${path.relative(ROOT, args.out)}`);
	const failed = [...results, ...itemResults, ...(soak ? [soak] : [])].some((r) => r.failures > 0);
	if (failed) warn('some requests failed (errors, timeouts or non-2xx answers); see the table');
	if (soak && !soak.rss.flat) warn("the app's memory grew during the soak");
	return failed || (soak && !soak.rss.flat) ? 1 : 0;
});

/** Start the app on the bench services with the demo data plus invented load sites. */
async function ownApp() {
	const config = resolveConfig('bench');
	// The app runs as `npm start` runs it: a production build in production mode.
	/** @type {Record<string, string>} */
	const appEnv = { ...config.appEnv, NODE_ENV: 'production' };
	await claimRun(config.storageDir, 'npm run bench:load');

	const { checkPortsFree, startEmbeddedServices } = await import('./lib/services.js');
	const { applyMigrations } = await import('./migrate.js');
	const { seedDemoData } = await import('./lib/seed-runner.js');
	const { START_BUILD_DIR, buildApp, startBuiltApp } = await import('./lib/app.js');
	const { addLoadSites } = await import('./lib/bench-load.js');

	await checkPortsFree(config, ['app', 's3', 'smtp', 'mailWeb']);
	await startEmbeddedServices(config, { freshDatabase: true, freshObjects: true });
	step('applying database migrations');
	await applyMigrations(appEnv.DATABASE_URL);
	await seedDemoData({ ...appEnv, THERMALITH_SEED: 'if-empty' });
	step(`adding ${args.sites} invented public sites`);
	const { siteId, region } = await addLoadSites(appEnv.DATABASE_URL, args.sites);
	await buildApp(START_BUILD_DIR, appEnv);
	await startBuiltApp(START_BUILD_DIR, appEnv);
	const appPid = JSON.parse(
		fs.readFileSync(path.join(config.storageDir, 'run', 'service-app.json'), 'utf8')
	).pid;
	const [w, s, e, n] = region;
	return {
		base: appEnv.ORIGIN,
		appPid: /** @type {number | null} */ (appPid),
		data: `demo scenario plus ${args.sites} invented public sites`,
		items: ITEMS,
		routes: [
			{
				name: 'map data (sites.geojson, one map view)',
				path: `/api/v1/sites.geojson?bbox=8,58,10,60`
			},
			{ name: 'site page', path: `/sites/${siteId}` },
			{
				name: 'sites API (whole region, filtered)',
				path: `/api/v1/sites.geojson?bbox=${w},${s},${e},${n}&minHeatFlow=90&maxHeatFlow=120`
			}
		]
	};
}

/** An app that is already running (`npm start`): its targets come from the start profile's database. */
async function runningApp(/** @type {string} */ base) {
	const config = resolveConfig('start');
	const { runningAppTargets, viewBox } = await import('./lib/bench-load.js');
	const { LARGE_ORG_ID } = await import('./lib/large-seed.js');
	const t = await runningAppTargets(config.appEnv.DATABASE_URL, LARGE_ORG_ID);
	if (!t.large)
		warn('the large scenario is not seeded (npm run seed:large): loading the demo data');
	let appPid = null;
	try {
		appPid = JSON.parse(
			fs.readFileSync(path.join(config.storageDir, 'run', 'service-app.json'), 'utf8')
		).pid;
	} catch {
		// an app not started by `npm start` here: no memory samples
	}
	const zoom = 12;
	const view = viewBox(t.lon, t.lat, zoom);
	const region = viewBox(t.lon, t.lat, 7);
	step(
		`loading ${base}: ${t.totalSites} sites; views in "${t.datasetTitle}" (${t.datasetSites} sites)`
	);
	return {
		base,
		appPid: /** @type {number | null} */ (appPid),
		data: `${t.totalSites} sites in the database${t.large ? ' (the large scenario of npm run seed:large)' : ''}`,
		items: ITEMS,
		routes: [
			{
				name: `map data (/api/v1/map, one view at zoom ${zoom})`,
				path: `/api/v1/map?bbox=${view}&zoom=${zoom}`
			},
			{ name: 'site page', path: `/sites/${t.siteId}` },
			{
				name: 'sites API (/api/v1/sites, a page of 100 in a region, filtered)',
				path: `/api/v1/sites?limit=100&bbox=${region}&minHeatFlow=60&maxHeatFlow=90`
			}
		]
	};
}
