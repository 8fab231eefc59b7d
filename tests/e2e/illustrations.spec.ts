import { expect, test, type Locator } from '@playwright/test';

/** Every image in `scope` has loaded a real picture (a broken image has naturalWidth 0). */
async function expectImagesLoaded(scope: Locator, count: number) {
	const images = scope.locator('img');
	await expect(images).toHaveCount(count);
	for (const img of await images.all()) {
		await img.scrollIntoViewIfNeeded();
		await expect.poll(() => img.evaluate((el: HTMLImageElement) => el.complete && el.naturalWidth)).toBeGreaterThan(0);
		await expect(img).toHaveAttribute('alt', /\S/);
	}
}

test('the landing page shows the rendered before and after', async ({ page }) => {
	await page.goto('/');
	const pair = page.getByTestId('before-after');
	await expect(pair.getByRole('heading', { name: 'Same runner, same sun, two exposures' })).toBeVisible();
	await expectImagesLoaded(pair, 2);
	await expect(pair).toContainText('not photographed');
	await pair.screenshot({ path: 'test-results/screenshots/landing-before-after.png' });
});

test.describe('on a phone', () => {
	test.use({ viewport: { width: 390, height: 844 }, deviceScaleFactor: 2 });

	test('the before and after stack and fit the screen', async ({ page }) => {
		await page.goto('/');
		const pair = page.getByTestId('before-after');
		await expectImagesLoaded(pair, 2);
		const [a, b] = await pair.locator('img').all();
		const boxA = (await a.boundingBox())!;
		const boxB = (await b.boundingBox())!;
		expect(boxB.y).toBeGreaterThan(boxA.y + boxA.height - 1);
		expect(boxA.width).toBeLessThanOrEqual(390);
		await page.screenshot({ path: 'test-results/screenshots/landing-phone.png', fullPage: true });
	});
});
