import { redirect } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';

// Public: only sends the visitor on to their cruises or to sign-in.
export const load: PageServerLoad = ({ locals }) => {
	redirect(303, locals.user ? '/cruises' : '/signin');
};
