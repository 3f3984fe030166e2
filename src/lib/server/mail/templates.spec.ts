import { describe, expect, it } from 'vitest';
import * as templates from './templates';

describe('mail templates', () => {
	it('a reset mail carries the link and says how long it works', () => {
		const m = templates.passwordReset({ link: 'http://x/reset/abc', expiresMinutes: 60 });
		expect(m.subject).toMatch(/reset/i);
		expect(m.text).toContain('http://x/reset/abc');
		expect(m.text).toContain('60 minutes');
	});

	it('a cruise invitation names the cruise and the role', () => {
		const m = templates.cruiseInvitation({
			inviterName: 'Ana',
			cruiseCode: 'WL-1',
			cruiseTitle: 'Ridge',
			roleLabel: 'port agent',
			link: 'http://x/invite/t',
			expiresDays: 14
		});
		expect(m.subject).toBe('Invitation to cruise WL-1 as port agent');
		expect(m.text).toContain('http://x/invite/t');
		expect(m.text).toContain('14 days');
	});
});
