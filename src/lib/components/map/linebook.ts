// The line book: every line and station of the plan as table rows with the server's computed
// values, sortable by any column (empty values last whichever way).
import { kmToNm } from '$lib/engine/time';
import { IHO_LABELS, PURPOSE_LABELS, STATION_LABELS } from './form';
import type { PlanFeature } from './types';

export interface BookRow {
	id: string;
	kind: 'line' | 'station';
	name: string;
	what: string;
	lengthKm: number | null;
	lengthNm: number | null;
	speedKn: number | null;
	overlapPct: number | null;
	iho: string | null;
	durationH: number | null;
	minDepthM: number | null;
	maxDepthM: number | null;
}

export type BookColumn = Exclude<keyof BookRow, 'id'>;

export function bookRows(features: readonly PlanFeature[]): BookRow[] {
	const rows: BookRow[] = [];
	for (const f of features) {
		const p = f.properties;
		if (p.kind === 'line') {
			rows.push({
				id: f.id,
				kind: 'line',
				name: p.name,
				what: PURPOSE_LABELS[p.purpose],
				lengthKm: p.lengthKm ?? null,
				lengthNm: p.lengthKm === undefined ? null : kmToNm(p.lengthKm),
				speedKn: p.surveySpeedKn,
				overlapPct: p.overlapPct,
				iho: IHO_LABELS[p.ihoOrder],
				durationH: p.durationH ?? null,
				minDepthM: p.minDepthM ?? null,
				maxDepthM: p.maxDepthM ?? null
			});
		} else if (p.kind === 'station') {
			rows.push({
				id: f.id,
				kind: 'station',
				name: p.name,
				what: STATION_LABELS[p.stationKind],
				lengthKm: null,
				lengthNm: null,
				speedKn: null,
				overlapPct: null,
				iho: null,
				durationH: p.durationH ?? null,
				minDepthM: p.depthM ?? null,
				maxDepthM: p.depthM ?? null
			});
		}
	}
	return rows;
}

const collator = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });

export function sortRows(
	rows: readonly BookRow[],
	column: BookColumn,
	ascending = true
): BookRow[] {
	const dir = ascending ? 1 : -1;
	return [...rows].sort((a, b) => {
		const x = a[column];
		const y = b[column];
		if (x === null && y === null) return collator.compare(a.name, b.name);
		if (x === null) return 1;
		if (y === null) return -1;
		const c =
			typeof x === 'number' && typeof y === 'number'
				? x - y
				: collator.compare(String(x), String(y));
		return c === 0 ? collator.compare(a.name, b.name) : dir * c;
	});
}

export interface BookTotals {
	lines: number;
	stations: number;
	lengthKm: number;
	lineHours: number;
	stationHours: number;
}

export function bookTotals(rows: readonly BookRow[]): BookTotals {
	const t = { lines: 0, stations: 0, lengthKm: 0, lineHours: 0, stationHours: 0 };
	for (const r of rows) {
		if (r.kind === 'line') {
			t.lines++;
			t.lengthKm += r.lengthKm ?? 0;
			t.lineHours += r.durationH ?? 0;
		} else {
			t.stations++;
			t.stationHours += r.durationH ?? 0;
		}
	}
	return t;
}
