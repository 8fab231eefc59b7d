import { expect, test } from '@playwright/test';

test('on a phone the menu folds and the lesson fits the screen', async ({ page }) => {
	await page.goto('/courses/daylight-flash-for-action/what-a-stop-is');
	await expect(page.getByRole('link', { name: 'Courses' })).toBeHidden();
	await page.getByRole('button', { name: 'Menu' }).click();
	await expect(page.getByRole('link', { name: 'Courses' })).toBeVisible();
	const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
	expect(overflow).toBeLessThanOrEqual(0);
});
