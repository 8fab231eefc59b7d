// What axe cannot see: the main journeys with the keyboard alone (sign in, a lesson's calculator and Light Plan, an
// upload, a mentor's pin), a visible focus on everything the Tab key reaches on the way, no animation that could flash
// more than three times a second (WCAG 2.3.1), and no motion for whoever asks for less (WCAG 2.3.3).
import { expect, test, type Locator, type Page } from '@playwright/test';
import { enrolDemoLearner, framePair } from './support/enrolled-learner';
import { COURSE, demoAccount, LESSON, signInWith, type Role } from './support/screens';

enrolDemoLearner();

/** True when the focused element (or, for a visually hidden control, its label) draws a focus outline or ring. */
async function focusIsVisible(page: Page): Promise<{ visible: boolean; what: string }> {
	return page.evaluate(() => {
		const el = document.activeElement as HTMLElement | null;
		if (!el || el === document.body) return { visible: false, what: 'nothing' };
		const draws = (e: Element) => {
			const style = getComputedStyle(e);
			return (style.outlineStyle !== 'none' && parseFloat(style.outlineWidth) > 0) || style.boxShadow !== 'none';
		};
		const what = `${el.tagName.toLowerCase()} ${el.getAttribute('aria-label') ?? el.textContent?.trim().slice(0, 40) ?? ''}`;
		// a drawing that cannot take an outline (an SVG group) shows a ring of its own
		const ring = el.querySelector('[data-focus-ring]');
		if (ring) return { visible: getComputedStyle(ring).opacity !== '0', what };
		const box = el.getBoundingClientRect();
		if (box.width > 2 && box.height > 2) return { visible: draws(el), what };
		const labels = (el as HTMLInputElement).labels;
		return { visible: !!labels && [...labels].some(draws), what };
	});
}

/** Presses Tab until `target` has the focus, checking that every element reached on the way shows where the focus is. */
async function tabTo(page: Page, target: Locator, most = 80): Promise<void> {
	for (let i = 0; i < most; i++) {
		await page.keyboard.press('Tab');
		const focus = await focusIsVisible(page);
		expect.soft(focus.visible, `the focus on ${focus.what} is not visible`).toBe(true);
		if (await target.evaluate((el) => el === document.activeElement)) return;
	}
	throw new Error(`${most} presses of Tab never reached ${target}`);
}

async function signInByKeyboard(page: Page, role: Role, path: string) {
	const { email, password } = demoAccount(role);
	await page.goto(`/signin?redirectTo=${encodeURIComponent(path)}`);
	await tabTo(page, page.getByLabel('E-mail', { exact: true }));
	await page.keyboard.type(email);
	await tabTo(page, page.getByLabel('Password', { exact: true }));
	await page.keyboard.type(password);
	await page.keyboard.press('Enter');
	await expect(page).toHaveURL(new RegExp(`${path}$`));
}

/** Every running animation repeats no faster than three times a second. */
async function expectNoFastFlashing(page: Page) {
	const periods = await page.evaluate(() =>
		document.getAnimations().map((a) => {
			const timing = a.effect?.getComputedTiming();
			return { name: (a as CSSAnimation).animationName ?? 'script', period: Number(timing?.duration ?? Infinity) };
		})
	);
	for (const { name, period } of periods) expect(period, `animation ${name} repeats every ${period} ms`).toBeGreaterThanOrEqual(1000 / 3);
}

test('sign in, open a lesson from the course page and use its calculator, all by keyboard', async ({ page }) => {
	await signInByKeyboard(page, 'learner', `/courses/${COURSE}`);
	await tabTo(page, page.getByRole('link', { name: 'Guide numbers', exact: true }));
	await page.keyboard.press('Enter');
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Guide numbers');
	await expectNoFastFlashing(page);

	const stops = page.getByTestId('falloff-stops');
	const before = await stops.textContent();
	await tabTo(page, page.getByTestId('falloff-distance'));
	for (let i = 0; i < 10; i++) await page.keyboard.press('ArrowRight');
	// 3 m → 4 m: the flash falls by 2·log2(4/3) ≈ 0.83 stop (inverse-square law)
	await expect(page.getByTestId('falloff-distance-value')).toHaveText('4.0 m');
	await expect(stops).not.toHaveText(before!);
});

test('the Light Plan moves a light with the arrow keys', async ({ page }) => {
	await signInWith(page, demoAccount('learner').email, demoAccount('learner').password);
	await page.goto(`/courses/${COURSE}/${LESSON}`);
	await expectNoFastFlashing(page);
	const light = page.getByTestId('plan-light-1');
	const distance = page.getByTestId('plan-light-1-distance');
	const label = await light.getAttribute('aria-label');
	const metres = await distance.textContent();
	await tabTo(page, light);
	for (let i = 0; i < 5; i++) await page.keyboard.press('ArrowLeft');
	await expect(light).not.toHaveAttribute('aria-label', label!);
	await expect(distance).not.toHaveText(metres!);
});

test('a learner uploads an Attempt and a mentor pins a comment on it, by keyboard', async ({ page, browser }) => {
	test.setTimeout(150_000);
	const { reference, lit } = await framePair();
	await signInByKeyboard(page, 'learner', `/courses/${COURSE}/${LESSON}/assignments/${LESSON}`);
	for (const [name, buffer] of [
		['reference', reference],
		['lit', lit]
	] as const) {
		await tabTo(page, page.getByTestId(`frame-input-${name}`));
		const chooser = page.waitForEvent('filechooser');
		await page.keyboard.press('Space');
		await (await chooser).setFiles({ name: `${name}.jpg`, mimeType: 'image/jpeg', buffer });
		await expect(page.getByTestId(`frame-slot-${name}`)).toContainText(`${name}.jpg`);
	}
	await tabTo(page, page.getByTestId('send-attempt'));
	await page.keyboard.press('Enter');
	await expect(page).toHaveURL(/\/attempts\/[0-9a-f-]{36}$/);
	await expectNoFastFlashing(page);
	await expect(page.getByTestId('verdict-badge').first()).toHaveText('Passed', { timeout: 30_000 });
	const attempt = new URL(page.url()).pathname;

	const context = await browser.newContext();
	const mentor = await context.newPage();
	const review = attempt.replace('/attempts/', '/mentor/attempts/');
	await signInByKeyboard(mentor, 'mentor', review);
	const pinForm = mentor.getByRole('form', { name: 'Pin a comment on the lit frame' });
	await tabTo(mentor, pinForm.getByLabel('Across %'));
	await mentor.keyboard.press('Control+A');
	await mentor.keyboard.type('40');
	await mentor.keyboard.press('Tab');
	await mentor.keyboard.press('Control+A');
	await mentor.keyboard.type('30');
	await mentor.keyboard.press('Tab');
	await mentor.keyboard.type('The rim light spills onto the cheek here.');
	await mentor.keyboard.press('Enter');
	await expect(mentor.getByRole('status').filter({ hasText: 'Pin 1 added.' })).toBeVisible();
	await expect(mentor.getByRole('region', { name: 'The lit frame' }).getByTestId('pin-1')).toBeVisible();
	await context.close();
});

test('whoever asks for less motion gets none', async ({ page }) => {
	await page.goto('/');
	// the pulsing dot of an Attempt being graded, placed on the page with the app's own styles
	const pulse = async () =>
		page.evaluate(() => {
			const dot = document.createElement('span');
			dot.className = 'animate-pulse';
			document.body.append(dot);
			const style = getComputedStyle(dot);
			const answer = { duration: style.animationDuration, repeats: style.animationIterationCount };
			dot.remove();
			return answer;
		});
	expect(await pulse()).toEqual({ duration: '2s', repeats: 'infinite' });
	await page.emulateMedia({ reducedMotion: 'reduce' });
	expect(await pulse()).toEqual({ duration: '1e-05s', repeats: '1' });
});
