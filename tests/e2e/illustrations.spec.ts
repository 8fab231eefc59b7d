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

test('a lesson shows its rendered figure with a caption that says it is not a photograph', async ({ page }) => {
	await page.goto('/courses/daylight-flash-for-action/what-a-stop-is');
	const figure = page.getByTestId('lesson-figure').first();
	await expect(figure).toHaveAttribute('data-illustration', 'stop-ladder-rower');
	await expectImagesLoaded(figure, 1);
	await expect(figure.locator('figcaption')).toContainText('not photographed');
	await expect(figure.getByRole('listitem')).toHaveCount(4);
	await figure.screenshot({ path: 'test-results/screenshots/lesson-figure.png' });
});

test('the course page links to its instructor, whose page says the profile is invented', async ({ page }) => {
	await page.goto('/courses/daylight-flash-for-action');
	await page.getByTestId('instructor-link').click();
	await expect(page).toHaveURL(/\/instructors\/jun-halvorsen$/);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Jun Halvorsen');
	await expect(page.getByTestId('invented-note')).toContainText('invented');
	await expectImagesLoaded(page.getByTestId('instructor-portrait'), 1);
	await expect(page.getByTestId('instructor-portrait')).toContainText('Drawn by Stopwise');
	await expect(page.getByRole('link', { name: 'Daylight Flash for Action' })).toBeVisible();
	await page.screenshot({ path: 'test-results/screenshots/instructor.png', fullPage: true });
});

test('an unknown instructor is a 404 page', async ({ page }) => {
	const response = await page.goto('/instructors/nobody-here');
	expect(response?.status()).toBe(404);
	await expect(page.getByText('There is no such instructor.')).toBeVisible();
});
