import { expect, test, type Page } from '@playwright/test';
import { waitForMail } from '../support/server';
import { E2E_MAIL_DIR } from './env';
import { DEMO, shot, signInAs } from './fixtures';

// A participant of the demo cruise who has applied for leg 1 only.
const APPLICANT = 'yannick.osei@example.org';
const LEG2 = 'Leg 2 — southern segment and flanks';

/** A small well-formed PDF (ISO 32000-1 header, catalog, one page, trailer). */
const PDF = Buffer.from(
	'%PDF-1.4\n1 0 obj<</Type/Catalog/Pages 2 0 R>>endobj\n2 0 obj<</Type/Pages/Kids[3 0 R]/Count 1>>endobj\n' +
		'3 0 obj<</Type/Page/Parent 2 0 R/MediaBox[0 0 200 200]>>endobj\ntrailer<</Root 1 0 R>>\n%%EOF\n'
);

async function openParty(page: Page) {
	await page.getByRole('list', { name: 'Cruises' }).getByText('MT27-03').click();
	await page.getByRole('link', { name: 'Science party' }).click();
	await expect(page.getByRole('heading', { name: 'Berths', exact: true })).toBeVisible();
}

async function switchTo(page: Page, email: string) {
	await page.context().clearCookies();
	await signInAs(page, email);
}

test('apply and upload, the chief confirms, the participant sees it; medical stays with the few', async ({
	page
}) => {
	// Five sign-ins on a shared two-core machine.
	test.setTimeout(180_000);
	await signInAs(page, APPLICANT);
	await openParty(page);
	// Everyone sees berths used and free per leg: leg 2 has two free in the demo.
	await expect(page.getByTestId('berth-bar').filter({ hasText: LEG2 })).toContainText('2 free');

	await page.getByLabel('Leg', { exact: true }).selectOption({ label: LEG2 });
	await page.getByLabel('Role on board').selectOption('technician');
	await page.getByLabel('Institution').fill('Saltmarsh University (invented)');
	await page.getByRole('button', { name: 'Apply for a berth' }).click();
	await expect(page.getByText('Application sent. The chief scientist decides.')).toBeVisible();
	await expect(page.getByTestId('my-application').filter({ hasText: LEG2 })).toContainText(
		'Applied'
	);

	await page.getByLabel('Document', { exact: true }).selectOption('medical');
	await page.getByLabel('Expires on (if it does)').fill('2028-04-30');
	await page
		.getByLabel('File (PDF, JPEG or PNG, up to 10 MB)')
		.setInputFiles({ name: 'fitness-osei.pdf', mimeType: 'application/pdf', buffer: PDF });
	await page.getByRole('button', { name: 'Upload' }).click();
	await expect(page.getByText('fitness-osei.pdf uploaded.')).toBeVisible();
	const docLink = page.getByTestId('my-document').getByRole('link', { name: 'fitness-osei.pdf' });
	await expect(docLink).toBeVisible();
	const href = (await docLink.getAttribute('href'))!;
	await shot(page, 'party-participant');

	await switchTo(page, DEMO.chief);
	await openParty(page);
	const row = page
		.getByTestId('application')
		.filter({ hasText: 'Yannick Osei' })
		.filter({ hasText: LEG2 });
	await row.getByRole('button', { name: 'Confirm Yannick Osei' }).click();
	await expect(page.getByText('Yannick Osei: confirmed.')).toBeVisible();
	await expect(row).toContainText('Confirmed');
	await expect(page.getByTestId('berth-bar').filter({ hasText: LEG2 })).toContainText('1 free');
	await expect(page.getByTestId('documents-matrix')).toBeVisible();
	await shot(page, 'party-chief');
	// The chief scientist reads the medical document.
	expect((await page.request.get(href)).status()).toBe(200);

	await switchTo(page, APPLICANT);
	await page
		.getByRole('navigation', { name: 'Main' })
		.getByRole('link', { name: 'My cruises' })
		.click();
	await expect(page.getByTestId('my-cruise-application').filter({ hasText: LEG2 })).toContainText(
		'Confirmed'
	);
	await shot(page, 'party-my-cruises');
	const mail = await waitForMail(
		E2E_MAIL_DIR,
		(m) => m.to.includes(APPLICANT) && /berth is confirmed/.test(m.subject)
	);
	expect(mail.text).toContain(LEG2);
	expect(mail.text).not.toMatch(/medic|fitness/i);
	expect(mail.attachments).toEqual([]);

	for (const who of [DEMO.agent, DEMO.admin]) {
		await switchTo(page, who);
		const res = await page.request.get(href);
		expect(res.status(), who).toBe(403);
		expect((await res.json()).error.message).toMatch(/^Medical documents are read only by/);
	}
	await switchTo(page, DEMO.master);
	const res = await page.request.get(href);
	expect(res.status()).toBe(200);
	expect(res.headers()['content-type']).toBe('application/pdf');
	expect(Buffer.from(await res.body()).equals(PDF)).toBe(true);

	// The master reads the persons-on-board list; the newly confirmed person is on it.
	await openParty(page);
	await page.getByRole('link', { name: 'printable list' }).click();
	await expect(page.getByRole('heading', { name: /Persons on board/ })).toBeVisible();
	await expect(page.getByTestId('pob-row').filter({ hasText: 'RAFAEL QUENBY' })).toBeVisible();
	await shot(page, 'party-pob');
});
