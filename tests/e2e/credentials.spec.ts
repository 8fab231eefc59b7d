// A learner who finishes the demo course claims a certificate, downloads the PDF and the signed credential, and the public
// page verifies it; a changed copy reads "tampered"; an admin revokes it and the page says so. The finishing is set up in the
// database (lessons completed, passing verdicts), not clicked through.
import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { readFile } from 'node:fs/promises';
import postgres from 'postgres';
import { COURSE, demoAccount, signInWith } from './support/screens';
import { signUpAndConfirm } from './support/sign-up';

const sql = postgres(process.env.DATABASE_URL ?? 'postgres://stopwise@127.0.0.1:54329/stopwise', { max: 2, onnotice: () => {} });
const email = `e2e-certificate-${Date.now()}@test.example`;
const name = 'Rowan Tidewell (test)';

test.describe.configure({ timeout: 180_000 });

test.afterAll(async () => {
	await sql`delete from users where email = ${email}`;
	await sql.end();
});

/** Every published lesson of the demo course completed, and a passing graded Attempt at each of its Assignments. */
async function finishCourse(userId: string) {
	await sql`
		insert into lesson_progress (user_id, lesson_id, completed_at)
		select ${userId}, l.id, now() from lessons l join modules m on m.id = l.module_id join courses c on c.id = m.course_id
		where c.slug = ${COURSE} and l.published
		on conflict (user_id, lesson_id) do update set completed_at = now()`;
	await sql`
		insert into attempts (id, user_id, assignment_id, submission_key, status, auto_verdict, verdict, spec, subject_box, graded_at)
		select gen_random_uuid()::text, ${userId}, a.id, gen_random_uuid()::text, 'graded', 'pass', 'pass', a.spec, '{"x":0.3,"y":0.2,"w":0.4,"h":0.6}'::jsonb, now()
		from assignments a join lessons l on l.id = a.lesson_id join modules m on m.id = l.module_id join courses c on c.id = m.course_id
		where c.slug = ${COURSE} and l.published`;
}

async function noGraveViolations(page: Page) {
	const { violations } = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa']).analyze();
	const grave = violations.filter((v) => v.impact === 'serious' || v.impact === 'critical');
	expect(grave.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`), page.url()).toEqual([]);
}

async function downloadOf(page: Page, testId: string): Promise<{ name: string; bytes: Buffer }> {
	const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId(testId).click()]);
	return { name: download.suggestedFilename(), bytes: await readFile((await download.path())!) };
}

test('a learner who finished the demo course downloads a PDF and a credential that the public page verifies', async ({ page, browser }) => {
	await signUpAndConfirm(page, name, email, 'a long e2e passphrase');
	const [{ id: userId }] = await sql<{ id: string }[]>`select id from users where email = ${email}`;
	await finishCourse(userId);

	await page.goto('/progress');
	const card = page.getByTestId('certificate-card');
	await expect(card.getByRole('heading', { name: 'Certificate: Daylight Flash for Action' })).toBeVisible();
	await card.getByRole('button', { name: 'Claim my certificate' }).click();
	await expect(card.getByTestId('certificate-pdf')).toBeVisible();
	await noGraveViolations(page);

	const pdf = await downloadOf(page, 'certificate-pdf');
	expect(pdf.name).toBe('stopwise-certificate-daylight-flash-for-action.pdf');
	expect(pdf.bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');
	const jwt = await downloadOf(page, 'certificate-jwt');
	const token = jwt.bytes.toString('utf8');
	expect(token.split('.')).toHaveLength(3);

	// what an outside verifier fetches: the key set its header's kid points into, and the issuer profile
	const kid = (JSON.parse(Buffer.from(token.split('.')[0], 'base64url').toString('utf8')) as { kid: string }).kid;
	const jwks = (await (await page.request.get('/.well-known/jwks.json')).json()) as { keys: { kid: string; d?: string }[] };
	expect(jwks.keys.map((k) => k.kid)).toContain(kid);
	expect(jwks.keys.some((k) => k.d)).toBe(false);
	expect(await (await page.request.get('/credentials/issuer')).json()).toMatchObject({ type: ['Profile'], name: 'Stopwise' });

	// the certificate's own page (where the PDF's QR code leads)
	await card.getByTestId('certificate-page').click();
	await expect(page).toHaveURL(/\/verify\/credential\/[0-9a-f-]{36}$/);
	const answer = page.getByTestId('verify-answer');
	await expect(answer).toHaveAttribute('data-status', 'valid');
	await expect(answer.getByTestId('verify-who')).toHaveText(name);
	await noGraveViolations(page);
	const certificateUrl = page.url();

	// the pasted .jwt, and a copy with one character changed
	await page.goto('/verify/credential');
	await page.getByLabel('The credential').fill(token);
	await page.getByRole('button', { name: 'Check it' }).click();
	await expect(page.getByTestId('verify-answer')).toHaveAttribute('data-status', 'valid');
	const parts = token.split('.');
	const i = Math.floor(parts[1].length / 2);
	parts[1] = parts[1].slice(0, i) + (parts[1][i] === 'A' ? 'B' : 'A') + parts[1].slice(i + 1);
	await page.getByLabel('The credential').fill(parts.join('.'));
	await page.getByRole('button', { name: 'Check it' }).click();
	await expect(page.getByTestId('verify-answer')).toHaveAttribute('data-status', 'tampered');
	await expect(page.getByTestId('verify-answer')).toContainText('Tampered');

	// an admin revokes it; the public page then says so
	const adminContext = await browser.newContext({ baseURL: test.info().project.use.baseURL });
	const admin = await adminContext.newPage();
	await signInWith(admin, demoAccount('admin').email, demoAccount('admin').password);
	await admin.goto('/admin/credentials');
	const row = admin.getByTestId('credential-row').filter({ hasText: email });
	await row.getByLabel('Why it is revoked, for the audit log').fill('e2e: issued by mistake');
	await row.getByRole('button', { name: 'Revoke' }).click();
	await expect(row).toContainText('revoked');
	await adminContext.close();

	await page.goto(certificateUrl);
	await expect(page.getByTestId('verify-answer')).toHaveAttribute('data-status', 'revoked');
	await expect(page.getByTestId('verify-answer')).toContainText('e2e: issued by mistake');
});
