// Security headers on the built app: a hash-based Content-Security-Policy that forbids framing, nosniff, a referrer
// policy; and pages still hydrate and run their calculators under the policy, with no violation reported.
import { createHash } from 'node:crypto';
import { expect, test, type Page } from '@playwright/test';

function watchViolations(page: Page): string[] {
	const seen: string[] = [];
	page.on('console', (message) => {
		if (/Content Security Policy/i.test(message.text())) seen.push(message.text());
	});
	return seen;
}

test('pages carry the policy headers; API answers carry nosniff and no framing', async ({ request }) => {
	const page = await request.get('/');
	const headers = page.headers();
	const csp = headers['content-security-policy'];
	expect(csp).toBeTruthy();
	expect(csp).toContain("frame-ancestors 'none'");
	expect(csp).toContain("object-src 'none'");
	expect(csp).toMatch(/script-src 'self' 'sha256-[A-Za-z0-9+/]+=*'/);
	expect(csp).not.toMatch(/script-src[^;]*'unsafe-inline'/);
	expect(csp).not.toContain("'nonce-");
	expect(headers['x-content-type-options']).toBe('nosniff');
	expect(headers['referrer-policy']).toBe('same-origin');
	expect(headers['x-frame-options']).toBe('DENY');
	// the only scripts allowed inline are the page's own, by the SHA-256 of their text (CSP Level 3, hash-source)
	const inline = [...(await page.text()).matchAll(/<script>([\s\S]*?)<\/script>/g)].map((m) => m[1]);
	expect(inline.length).toBeGreaterThan(0);
	const allowed = [...csp.matchAll(/'sha256-([A-Za-z0-9+/]+=*)'/g)].map((m) => m[1]);
	expect(allowed.sort()).toEqual(inline.map((text) => createHash('sha256').update(text).digest('base64')).sort());

	const api = await request.get('/api/health');
	expect(api.headers()['x-content-type-options']).toBe('nosniff');
	expect(api.headers()['x-frame-options']).toBe('DENY');
});

test('under the policy the lesson calculators hydrate and respond, with no violation', async ({ page }) => {
	const violations = watchViolations(page);
	await page.goto('/courses/daylight-flash-for-action/what-a-stop-is');
	const ev = page.getByTestId('ev100');
	await expect(ev).toHaveText('EV 14.0');
	await page.getByTestId('shutter').focus();
	for (let i = 0; i < 3; i++) await page.keyboard.press('ArrowRight');
	// one stop shorter shutter, one more EV (APEX, ASA PH2.5-1960)
	await expect(ev).toHaveText('EV 15.0');
	await page.goto('/signin');
	await page.goto('/courses');
	expect(violations).toEqual([]);
});

test('a page of ours refuses to load inside a frame', async ({ page, baseURL }) => {
	const violations: string[] = [];
	page.on('console', (m) => violations.push(m.text()));
	// a page on another origin (about:blank with a srcdoc) framing ours
	await page.setContent(`<iframe id="f" src="${baseURL}/courses"></iframe>`);
	const frame = page.frames().find((f) => f.url().includes('/courses'));
	// Chromium blocks the navigation: the frame stays empty (chrome-error) and logs the refusal
	await expect.poll(async () => violations.some((v) => /frame-ancestors|X-Frame-Options|refused to/i.test(v))).toBe(true);
	if (frame) expect(await frame.locator('h1').count()).toBe(0);
});
