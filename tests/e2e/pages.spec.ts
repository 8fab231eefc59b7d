import { expect, test } from '@playwright/test';

test('the landing page says what Stopwise teaches', async ({ page }) => {
	await page.goto('/');
	await expect(page.getByRole('heading', { level: 1 })).toContainText('flash');
	await page.getByRole('link', { name: 'Browse courses' }).click();
	await expect(page).toHaveURL(/\/courses$/);
});

test('catalogue → course → lesson', async ({ page }) => {
	await page.goto('/courses');
	await page.getByRole('link', { name: 'Daylight Flash for Action' }).click();
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Daylight Flash for Action');
	await expect(page.getByRole('heading', { name: /Thinking in stops/ })).toBeVisible();
	await page.getByRole('link', { name: 'What a stop is' }).click();
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('What a stop is');
	await expect(page.getByRole('region', { name: 'Stop Ladder' })).toBeVisible();
});

test('an unknown lesson is a 404 page, not an error', async ({ page }) => {
	const response = await page.goto('/courses/daylight-flash-for-action/no-such-lesson');
	expect(response?.status()).toBe(404);
	await expect(page.getByText('There is no such lesson.')).toBeVisible();
});

test('the Stop Ladder recomputes EV100 as a control moves', async ({ page }) => {
	await page.goto('/courses/daylight-flash-for-action/what-a-stop-is');
	const ev = page.getByTestId('ev100');
	// APEX, ASA PH2.5-1960: EV = log2(N²/t); f/8 = 2^3, 1/250 marks 2^-8 → log2(64·256) = 14
	await expect(ev).toHaveText('EV 14.0');
	const shutter = page.getByTestId('shutter');
	await shutter.focus();
	for (let i = 0; i < 3; i++) await page.keyboard.press('ArrowRight');
	// one stop shorter (1/500 marks 2^-9): EV 15
	await expect(page.getByTestId('shutter-value')).toHaveText('1/500 s');
	await expect(ev).toHaveText('EV 15.0');
	const iso = page.getByTestId('iso');
	await iso.focus();
	for (let i = 0; i < 6; i++) await page.keyboard.press('ArrowRight');
	// ISO 400 is two stops more sensitive: EV100 = 15 − log2(400/100) = 13 (APEX Sv, ASA PH2.5-1960)
	await expect(page.getByTestId('iso-value')).toHaveText('400');
	await expect(ev).toHaveText('EV 13.0');
});
