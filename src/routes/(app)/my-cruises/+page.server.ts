import * as berths from '$lib/server/berths';
import * as cruises from '$lib/server/cruises';
import * as documents from '$lib/server/documents';
import * as guards from '$lib/server/guards';
import * as pob from '$lib/server/pob';
import type { PageServerLoad } from './$types';

/** A participant's own side of every cruise they sail on: applications, missing documents. */
export const load: PageServerLoad = (event) => {
	const user = guards.requireUser(event);
	const sailing = cruises
		.listFor({ id: user.id, role: 'member' })
		.filter((c) => c.role === 'participant' || c.role === 'chief_scientist');
	return {
		hasTravelDetails: pob.profile(user.id) !== null,
		cruises: sailing.map((c) => {
			const legs = berths.legTotals(c.id);
			return {
				id: c.id,
				code: c.code,
				title: c.title,
				departureAt: c.departureAt,
				legs,
				applications: berths.applications(c.id, user.id).map((a) => ({
					id: a.id,
					legName: legs.find((l) => l.id === a.legId)?.name ?? '—',
					status: a.status,
					waitlistPosition: a.waitlistPosition,
					decisionMessage: a.decisionMessage
				})),
				documents: documents.mine(user.id, c.id)
			};
		})
	};
};
