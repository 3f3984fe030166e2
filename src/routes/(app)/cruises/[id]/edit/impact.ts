// What deleting a cruise takes with it, as the confirmation lists it ("14 survey lines").
import type { DeleteImpact } from '$lib/server/cruises';

const NAMES: [keyof DeleteImpact, string, string][] = [
	['legs', 'leg', 'legs'],
	['lines', 'survey line', 'survey lines'],
	['stations', 'station', 'stations'],
	['areas', 'survey area', 'survey areas'],
	['ridges', 'ridge axis', 'ridge axes'],
	['members', 'person’s role on it', 'people’s roles on it'],
	['applications', 'berth application', 'berth applications'],
	['documents', 'document', 'documents'],
	['invoices', 'invoice (with its payments)', 'invoices (with their payments)'],
	['clearances', 'clearance', 'clearances'],
	['deadlines', 'deadline', 'deadlines']
];

export function impactList(impact: DeleteImpact): string[] {
	const out = NAMES.map(([k, one, many]) => `${impact[k]} ${impact[k] === 1 ? one : many}`);
	return out.concat('its order of work, clock changes, calendar entries and history');
}
