import { expect, test } from '@playwright/test';
import { waitForMail } from '../support/server';
import { E2E_MAIL_DIR } from './env';
import { DEMO, shot, signInAs } from './fixtures';

test('the port agent pays an invoice: declined card first, then the good card; Paid and a receipt', async ({
	page
}) => {
	await signInAs(page, DEMO.agent);
	await page.getByRole('list', { name: 'Cruises' }).getByRole('link').first().click();
	await page
		.getByRole('navigation', { name: 'Cruise' })
		.getByRole('link', { name: 'Invoices' })
		.click();
	await expect(page.getByRole('heading', { name: 'Invoices', exact: true })).toBeVisible();
	await shot(page, 'invoices-agent');
	await page.getByRole('link', { name: 'WL-2027-0002' }).click();
	await expect(page.getByTestId('invoice-status')).toHaveText('Issued');
	const total = (await page.getByTestId('invoice-total').textContent())!.trim();
	const invoiceUrl = page.url();

	await page.getByRole('button', { name: /^Pay EUR/ }).click();
	// The hosted payment page of the payment service.
	await expect(page.getByLabel('Card number')).toBeVisible();
	expect(page.url()).not.toContain(new URL(invoiceUrl).host);
	await page.getByLabel('Card number').fill('4000 0000 0000 0002');
	await page.getByLabel(/Expiry/).fill('12/34');
	await page.getByLabel('CVC').fill('123');
	await page.getByRole('button', { name: 'Pay' }).click();
	await expect(page.getByRole('alert')).toContainText('Your card was declined');
	await shot(page, 'payment-declined');

	// Wakeline still shows the invoice open and unpaid.
	const check = await page.context().newPage();
	await check.goto(invoiceUrl);
	await expect(check.getByTestId('invoice-status')).toHaveText('Issued');
	await expect(check.getByTestId('invoice-outstanding')).toHaveText(total);
	await check.close();

	await page.getByLabel('Card number').fill('4242 4242 4242 4242');
	await page.getByLabel(/Expiry/).fill('12/34');
	await page.getByLabel('CVC').fill('123');
	await page.getByRole('button', { name: 'Pay' }).click();

	await expect(page).toHaveURL(new RegExp(`${invoiceUrl.replace(/[/.?]/g, '\\$&')}\\?checkout=`));
	await expect(page.getByTestId('invoice-status')).toHaveText('Paid');
	await expect(page.getByRole('link', { name: 'Printable receipt' })).toBeVisible();
	await shot(page, 'invoice-paid');

	const receipt = await waitForMail(
		E2E_MAIL_DIR,
		(m) => m.to.includes(DEMO.agent) && m.subject.includes('WL-2027-0002')
	);
	expect(receipt.subject).toContain(total);
	expect(receipt.text).toContain('/receipt');

	const [printable] = await Promise.all([
		page.waitForEvent('popup'),
		page.getByRole('link', { name: 'Printable receipt' }).click()
	]);
	await expect(printable.getByRole('heading', { name: /^Receipt R-/ })).toBeVisible();
	await expect(printable.getByText(total)).toBeVisible();
});

test('participants do not see invoices', async ({ page }) => {
	await signInAs(page, DEMO.participant);
	await page.getByRole('list', { name: 'Cruises' }).getByRole('link').first().click();
	await expect(page.getByRole('navigation', { name: 'Cruise' })).toBeVisible();
	await expect(
		page.getByRole('navigation', { name: 'Cruise' }).getByRole('link', { name: 'Invoices' })
	).toHaveCount(0);
});
