import { expect, type Page } from '@playwright/test';
import { DEMO } from '../support/server';
import { SCREENSHOTS } from './env';

export { DEMO };

export async function signInAs(page: Page, email: string, password = DEMO.password) {
	await page.goto('/signin');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/cruises$/);
}

export async function shot(page: Page, name: string) {
	await page.screenshot({ path: `${SCREENSHOTS}/${name}.png`, fullPage: true });
}
