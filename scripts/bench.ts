/**
 * Engine benchmark: `npm run bench`. Prints the median of several runs (ms) for
 * (a) a 2000 km line sampled every 100 m (20 001 samples), full depth profile against ridge axes
 *     of 50, 500 and 5000 vertices (building the axis index included);
 * (a′) the same 20 001 points as single exact nearest-point queries on a prebuilt index, which
 *     should grow about log(n);
 * (b) a 500 × 500 predicted-depth grid;
 * (c) one melting column (uncached);
 * (d) one depth-adaptive line plan over a 100 × 60 km area;
 * (e) adversarial axis shapes at the shared size limits (engine/limits.ts): a dense zig-zag, a
 *     wide zig-zag, a spiral and a comb, each 2000 vertices within 10 000 km; the index build and a
 *     profile, then the exact nearest-point queries alone, which should stay near log(n);
 * (f) a 1 000 000-fix MGD77T file (written to a temporary file first) streamed from disk through
 *     the track reader in 64 KiB chunks, then its residual depths computed (target < 5 s), with the
 *     memory the fixes and the residual arrays take beside it.
 */
import { cpus, loadavg } from 'node:os';
import { depthProfileForRidges, depthGrid, RidgeDepthModel } from '../src/lib/engine/profile';
import { PolylineIndex, direct, sampleLine, type LonLat } from '../src/lib/engine/geodesy';
import { meltColumn } from '../src/lib/engine/melt';
import { planSurvey } from '../src/lib/engine/survey';
import { axisProblem, SIZES } from '../src/lib/engine/limits';
import { createReadStream, mkdtempSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { TrackReader } from '../src/lib/engine/formats/track';
import { mgd77tRow, MGD77T_COLUMNS } from '../src/lib/engine/formats/mgd77t';
import { trackResiduals } from '../src/lib/engine/residual';

function median(xs: number[]): number {
	const s = xs.slice().sort((a, b) => a - b);
	const m = s.length >> 1;
	return s.length % 2 ? s[m] : 0.5 * (s[m - 1] + s[m]);
}

/** Median wall-clock, median process CPU and fastest wall time (ms) over `runs` after `warmup`. */
function time(runs: number, warmup: number, f: (i: number) => unknown): [number, number, number] {
	for (let i = 0; i < warmup; i++) f(-1 - i);
	const wall: number[] = [];
	const cpu: number[] = [];
	for (let i = 0; i < runs; i++) {
		const c0 = process.cpuUsage();
		const t0 = performance.now();
		f(i);
		wall.push(performance.now() - t0);
		const c = process.cpuUsage(c0);
		cpu.push((c.user + c.system) / 1000);
	}
	return [median(wall), median(cpu), Math.min(...wall)];
}

/** A wiggly, north-trending axis 1000 km long near 26°N (Atlantic-like), with n vertices. */
function axis(n: number): LonLat[] {
	const pts: LonLat[] = [];
	for (let i = 0; i < n; i++) {
		const t = i / (n - 1);
		pts.push([-44.8 + 0.08 * Math.sin(t * 37) + 0.03 * Math.sin(t * 211), 21.5 + 9 * t]);
	}
	return pts;
}

const report: [string, [number, number, number], string][] = [];

// (a) 2000 km line across the axis, every 100 m
const centre: LonLat = [-44.8, 26];
const a = direct(centre, 95, -1000e3);
const b = direct(centre, 95, 1000e3);
const line: LonLat[] = [
	[a.lon, a.lat],
	[b.lon, b.lat]
];
for (const n of [50, 500, 5000]) {
	const ridges = [{ axis: axis(n), fullRateMmYr: 23 }];
	let count = 0;
	const ms = time(15, 3, () => {
		count = depthProfileForRidges(line, ridges, { spacingKm: 0.1 }).samples.length;
	});
	report.push([
		`(a) depth profile, ${count} samples, ${n}-vertex axis`,
		ms,
		n === 500 ? '< 100' : ''
	]);
}

// (a′) the nearest-point queries alone (index built once): exact per sample, to show ~log(n)
{
	const s = sampleLine(line, 100);
	for (const n of [50, 500, 5000]) {
		const index = new PolylineIndex([axis(n)]);
		const ms = time(9, 2, () => {
			for (let k = 0; k < s.count; k++) index.nearest(s.lon[k], s.lat[k]);
		});
		report.push([`(a′) ${s.count} exact nearest-point queries, ${n}-vertex axis`, ms, '']);
	}
}

// (b) 500 × 500 grid over 10° × 10° around the axis
{
	const ridges = [{ axis: axis(500), fullRateMmYr: 23 }];
	const ms = time(5, 1, () => depthGrid([-50, 21, -40, 31], 500, 500, ridges));
	report.push(['(b) 500 × 500 depth grid', ms, '< 1000']);
}

// (c) one melting column, McKenzie & Bickle, step 1e-3 GPa; a new Tp each run defeats the memo
{
	const ms = time(15, 3, (i) => meltColumn(1350 + (i + 10) * 1e-7));
	report.push(['(c) one melting column (M&B88, 1350 °C)', ms, '< 20']);
}

// (d) depth-adaptive plan over a 100 km × 60 km area on the east flank
{
	const depth = new RidgeDepthModel([{ axis: axis(500), fullRateMmYr: 23 }]);
	const sw = direct([-44.8, 25.5], 90, 8000);
	const se = direct([sw.lon, sw.lat], 90, 60_000);
	const ne = direct([se.lon, se.lat], 0, 100_000);
	const nw = direct([sw.lon, sw.lat], 0, 100_000);
	const polygon: LonLat[] = [
		[sw.lon, sw.lat],
		[se.lon, se.lat],
		[ne.lon, ne.lat],
		[nw.lon, nw.lat]
	];
	let lines = 0;
	const ms = time(9, 2, () => {
		const plan = planSurvey(polygon, (lon, lat) => depth.depthAt(lon, lat, false).depthM, {
			headingDeg: 0,
			overlap: 0.3,
			swathAngleDeg: 120
		});
		lines = plan.lines.length;
	});
	report.push([`(d) depth-adaptive plan, 100 × 60 km, ${lines} lines`, ms, '< 200']);
}

// (e) adversarial axis shapes, each within the shared limits
{
	const n = SIZES.axisVertices;
	const shapes: [string, LonLat[]][] = [
		// ≈ 5 km legs at a steep angle: every sample is near many legs
		[
			'dense zig-zag',
			Array.from({ length: n }, (_, i) => [-30 + (i % 2 ? 0.0222 : -0.0222), i * 0.00449])
		],
		// legs ≈ 4.9 km wide, nearly parallel: the foot jumps from leg to leg along the line
		[
			'flat zig-zag',
			Array.from({ length: n }, (_, i) => [-30 + (i % 2 ? 0.0222 : -0.0222), i * 0.0005])
		],
		[
			'spiral',
			Array.from({ length: n }, (_, i) => {
				const t = i / (n - 1);
				const a = t * 20 * Math.PI;
				return [-30 + 1.5 * t * Math.cos(a), 5 + 1.5 * t * Math.sin(a)] as LonLat;
			})
		],
		// teeth 20 km long every 2 km
		[
			'comb',
			Array.from({ length: n }, (_, i) => {
				const k = Math.floor(i / 2);
				const up = i % 4 === 1 || i % 4 === 2;
				return [-30 + k * 0.018, up ? 0.18 : 0] as LonLat;
			})
		]
	];
	for (const [name, ax] of shapes) {
		const problem = axisProblem(ax);
		if (problem) throw new Error(`${name}: ${problem.message}`);
		const cross: LonLat[] = [
			[ax[0][0] - 1, ax[0][1] - 0.5],
			[ax[n - 1][0] + 1, ax[n - 1][1] + 0.5]
		];
		const ridges = [{ axis: ax, fullRateMmYr: 23 }];
		let count = 0;
		const ms = time(5, 1, () => {
			count = depthProfileForRidges(cross, ridges, { spacingKm: 0.5 }).samples.length;
		});
		report.push([`(e) ${name}: profile ${count} samples, ${n}-vertex axis`, ms, '< 2000']);
		const index = new PolylineIndex([ax]);
		const s = sampleLine(cross, 500);
		const q = time(5, 1, () => {
			for (let k = 0; k < s.count; k++) index.nearest(s.lon[k], s.lat[k]);
		});
		report.push([`(e) ${name}: ${s.count} exact nearest-point queries`, q, '']);
	}
}

// (f) 1 000 000 MGD77T fixes: read (streamed) + residuals
const trackNotes: string[] = [];
{
	const N = 1_000_000;
	const dir = mkdtempSync(join(tmpdir(), 'wakeline-bench-'));
	const file = join(dir, 'track.m77t');
	// Zig-zag lines 300 km across the axis, 50 m between fixes, each line 5 km further north.
	const rows: string[] = [MGD77T_COLUMNS.join('\t')];
	const perLine = 6000;
	const t0 = Date.UTC(2020, 0, 1) / 1000;
	writeFileSync(file, '');
	for (let i = 0; i < N; i++) {
		const line = Math.floor(i / perLine);
		const k = i % perLine;
		const x = (line % 2 ? perLine - k : k) * 0.05 - 150; // km from the axis
		const lat = 22 + line * 0.045;
		const lon = -44.8 + x / (111.32 * Math.cos((lat * Math.PI) / 180));
		const depth = 2600 + 365 * Math.sqrt(Math.abs(x) / 11.5) + 150 + ((i * 7919) % 200) - 100;
		rows.push(mgd77tRow('BENCH01', lon, lat, depth, t0 + i * 6));
		if (rows.length >= 20_000) {
			writeFileSync(file, rows.join('\n') + '\n', { flag: 'a' });
			rows.length = 0;
		}
	}
	if (rows.length) writeFileSync(file, rows.join('\n') + '\n', { flag: 'a' });
	const bytes = statSync(file).size;
	const ridges = [{ axis: axis(500), fullRateMmYr: 23 }];
	const mem = () => {
		const m = process.memoryUsage();
		return m.heapUsed + m.arrayBuffers;
	};
	const readOnce = async () => {
		const reader = new TrackReader({ filename: 'track.m77t' });
		const decoder = new TextDecoder();
		for await (const chunk of createReadStream(file, { highWaterMark: 64 * 1024 }))
			reader.push(decoder.decode(chunk as Buffer, { stream: true }));
		reader.push(decoder.decode());
		return reader.end();
	};
	const runs: number[][] = [];
	let peak = 0;
	for (let run = 0; run < 3; run++) {
		(globalThis as { gc?: () => void }).gc?.();
		const base = mem();
		const c0 = process.cpuUsage();
		const a0 = performance.now();
		const read = await readOnce();
		const a1 = performance.now();
		const c1 = process.cpuUsage(c0);
		const r = trackResiduals(read.fixes, ridges);
		const a2 = performance.now();
		const c2 = process.cpuUsage(c0);
		peak = Math.max(peak, mem() - base);
		const cpu = (c: NodeJS.CpuUsage) => (c.user + c.system) / 1000;
		runs.push([a1 - a0, a2 - a1, a2 - a0, r.stats.n, cpu(c1), cpu(c2) - cpu(c1), cpu(c2)]);
	}
	rmSync(dir, { recursive: true, force: true });
	runs.sort((p, q) => p[2] - q[2]);
	const [readMs, resMs, totalMs, n, readCpu, resCpu, totalCpu] = runs[1];
	const fixesMb = (N * 4 * 8) / 2 ** 20;
	report.push([
		`(f) read ${(bytes / 2 ** 20).toFixed(0)} MiB MGD77T, ${n} fixes (streamed)`,
		[readMs, readCpu, runs[0][0]],
		''
	]);
	report.push([`(f) residuals for ${n} fixes`, [resMs, resCpu, runs[0][1]], '']);
	report.push([`(f) read + residuals, 1 000 000 fixes`, [totalMs, totalCpu, runs[0][2]], '< 5000']);
	trackNotes.push(
		`(f) memory held after read + residuals: ${(peak / 2 ** 20).toFixed(0)} MiB ` +
			`(the fixes themselves: ${fixesMb.toFixed(0)} MiB as four Float64 columns; residual, ` +
			`prediction, band, age, distance: ${((N * 8 * 8 + N * 4) / 2 ** 20).toFixed(0)} MiB); ` +
			`file ${(bytes / 2 ** 20).toFixed(0)} MiB never held whole`
	);
}

const load = loadavg()[0];
console.log(
	`Wakeline engine benchmark — median wall-clock ms (median process CPU, fastest run beside). ` +
		`${cpus().length} CPUs, 1-min load average ${load.toFixed(2)}` +
		(load > cpus().length ? ' — the machine is busy, wall times are inflated' : '')
);
for (const [name, [wall, cpu, best], target] of report) {
	console.log(
		`${name.padEnd(56)} ${wall.toFixed(1).padStart(8)} ms  (cpu ${cpu.toFixed(1).padStart(7)}, ` +
			`best ${best.toFixed(1).padStart(7)})` +
			(target ? `   target ${target}` : '')
	);
}
for (const note of trackNotes) console.log(note);
