// Ship time as the chart shows it beside the tools: the plan's operating days against the
// allocation, from the server's timeline build (the same figures the overview and timeline show).

export interface ShipTime {
	operatingDays: number;
	allocatedDays: number | null;
	overrunDays: number;
	/** Lines and stations on the chart that are not yet in the order of work. */
	unordered: number;
}

export interface ShipTimeNote {
	tone: 'ok' | 'over';
	text: string;
}

const days = (n: number) => `${n.toLocaleString('en')} day${n === 1 ? '' : 's'}`;

export function shipTimeNote(s: ShipTime | null): ShipTimeNote | null {
	if (!s) return null;
	const waiting = s.unordered ? ` · ${s.unordered} not yet in the order of work` : '';
	if (!s.allocatedDays) return { tone: 'ok', text: `Plan: ${days(s.operatingDays)}${waiting}` };
	if (s.overrunDays > 0)
		return {
			tone: 'over',
			text: `Plan: ${days(s.operatingDays)}, ${days(s.overrunDays)} past the ${days(s.allocatedDays)} allocated${waiting}`
		};
	return {
		tone: 'ok',
		text: `Plan: ${days(s.operatingDays)} of ${days(s.allocatedDays)} allocated${waiting}`
	};
}
