// Sign-in lands each role where it works; sign-up comes back where the visitor was; lessons link to their neighbours;
// a revoked learner is offered no way back into paid lessons.
import { expect as baseExpect, test, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';
import postgres from 'postgres';
import { signUpAndConfirm } from './support/sign-up';

type Demo = { role: string; email: string; password: string };
const demo: Demo[] = JSON.parse(readFileSync('scripts/demo-accounts.json', 'utf8'));
const account = (role: string) => demo.find((d) => d.role === role)!;

const COURSE = 'daylight-flash-for-action';
const sql = postgres(process.env.DATABASE_URL ?? 'postgres://stopwise@127.0.0.1:54329/stopwise', { max: 2, onnotice: () => {} });
const unique = () => `${Date.now()}-${Math.floor(Math.random() * 1e6)}`;

// several sign-ins each (argon2 on purpose is slow), on a machine shared with other builds
test.describe.configure({ timeout: 90_000 });
const expect = baseExpect.configure({ timeout: 15_000 });

test.afterAll(async () => {
	await sql.end();
});

async function signIn(page: Page, email: string, password: string) {
	await page.getByLabel('E-mail', { exact: true }).fill(email);
	await page.getByLabel('Password', { exact: true }).fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
}

async function signOut(page: Page) {
	await page.getByRole('navigation', { name: 'Main' }).getByRole('button', { name: 'Sign out' }).click();
	await expect(page).toHaveURL(/\/signin\?notice=signed-out$/);
}

async function enrol(email: string) {
	await sql`insert into enrolments (user_id, course_id, source)
		select u.id, c.id, 'admin' from users u, courses c where u.email = ${email} and c.slug = ${COURSE}
		on conflict do nothing`;
}

test('previous and next lesson links follow the course order across modules', async ({ page }) => {
	const { email, password } = account('mentor'); // staff open every lesson
	await page.goto(`/signin?redirectTo=${encodeURIComponent(`/courses/${COURSE}/bracketing-in-stops`)}`);
	await expect(page.getByTestId('signin-reason')).toHaveText('Sign in to open this lesson.');
	await signIn(page, email, password);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Bracketing in whole stops');
	const pager = page.getByRole('navigation', { name: 'Lessons' });
	await expect(pager.getByRole('link', { name: /Previous.*Equivalent exposures/ })).toBeVisible();
	// the last lesson of module 1 leads into module 2
	await pager.getByRole('link', { name: /Next.*Shutter sets the ambient/ }).click();
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Shutter sets the ambient');
	await page.getByRole('navigation', { name: 'Lessons' }).getByRole('link', { name: /Previous/ }).click();
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Bracketing in whole stops');

	// the first lesson goes back to the outline, the last to the learner's progress
	await page.goto(`/courses/${COURSE}/what-a-stop-is`);
	await expect(page.getByRole('navigation', { name: 'Lessons' }).getByRole('link', { name: /Course outline/ })).toHaveAttribute('href', `/courses/${COURSE}`);
	const [last] = await sql<{ slug: string }[]>`select l.slug from lessons l join modules m on m.id = l.module_id join courses c on c.id = m.course_id
		where c.slug = ${COURSE} and l.published order by m.position desc, l.position desc, l.id desc limit 1`;
	await page.goto(`/courses/${COURSE}/${last.slug}`);
	await expect(page.getByRole('navigation', { name: 'Lessons' }).getByRole('link', { name: /See your progress/ })).toBeVisible();
	await expect(page.getByTestId('lesson-next')).toHaveCount(0);
});

test('sign-in lands mentors on the review queue with a count, authors on their lessons, admins on people', async ({ page }) => {
	for (const [role, url, heading] of [
		['mentor', /\/mentor$/, 'Review queue'],
		['author', /\/author$/, null],
		['admin', /\/admin\/people$/, 'People']
	] as const) {
		const { email, password } = account(role);
		await page.goto('/signin');
		await expect(page.getByTestId('signin-reason')).toHaveCount(0);
		await signIn(page, email, password);
		await expect(page, role).toHaveURL(url);
		if (heading) await expect(page.getByRole('heading', { level: 1 })).toHaveText(heading);
		if (role === 'mentor') {
			const [{ open }] = await sql<{ open: number }[]>`select count(*)::int as open from attempts where review_state = 'open' and status in ('graded', 'error')`;
			await expect(page.getByTestId('queue-waiting')).toContainText(open === 0 ? 'Nothing waits for review.' : `${open} Attempt`);
		}
		await signOut(page);
	}
});

test('sign-up returns to the course; a learner then lands on the lesson they opened last, and not after a refund', async ({ page }) => {
	const email = `e2e-landing-${unique()}@test.example`;
	const password = 'a stand in the wind';

	// from the course page, create an account and come straight back
	await page.goto(`/courses/${COURSE}`);
	await page.getByRole('link', { name: 'Create an account' }).click();
	await expect(page).toHaveURL(/\/signup\?redirectTo=%2Fcourses%2Fdaylight-flash-for-action$/);
	await expect(page.getByTestId('signup-reason')).toHaveText('Create an account to enrol in this course.');
	// the mailed link confirms the address, signs in and comes back to the course
	await signUpAndConfirm(page, 'Ines Marlow', email, password);
	await expect(page).toHaveURL(new RegExp(`/courses/${COURSE}$`));
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Daylight Flash for Action');

	// not enrolled and nothing opened yet: the catalogue
	await signOut(page);
	await signIn(page, email, password);
	await expect(page).toHaveURL(/\/courses$/);

	// enrolled (as an admin would), opens a paid lesson; the next sign-in continues there
	await enrol(email);
	await page.goto(`/courses/${COURSE}/inverse-square`);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('The inverse-square law');
	await signOut(page);
	await signIn(page, email, password);
	await expect(page).toHaveURL(new RegExp(`/courses/${COURSE}/inverse-square$`));
	await expect(page.getByTestId('continue')).toHaveCount(0);
	await page.goto('/courses');
	await expect(page.getByTestId('continue')).toHaveText('Continue: The inverse-square law');

	// refunded: no "Continue" into the paid lesson, anywhere; sign-in lands on the catalogue again
	await sql`update enrolments set status = 'revoked', revoked_at = now() where user_id = (select id from users where email = ${email})`;
	await page.goto('/courses');
	await expect(page.getByTestId('continue')).toHaveCount(0);
	await page.goto(`/courses/${COURSE}`);
	await expect(page.getByTestId('continue')).toHaveCount(0);
	// a free lesson opened afterwards is fine to continue
	await page.goto(`/courses/${COURSE}/guide-numbers`);
	await page.goto(`/courses/${COURSE}`);
	await expect(page.getByTestId('continue')).toHaveText('Continue: Guide numbers');
	await signOut(page);
	await signIn(page, email, password);
	await expect(page).toHaveURL(new RegExp(`/courses/${COURSE}/guide-numbers$`));
});

test('a paid lesson sends the visitor to sign in, saying why, and back again', async ({ page }) => {
	await page.goto(`/courses/${COURSE}/inverse-square`);
	await expect(page).toHaveURL(/\/signin\?redirectTo=%2Fcourses%2Fdaylight-flash-for-action%2Finverse-square$/);
	await expect(page.getByTestId('signin-reason')).toHaveText('Sign in to open this lesson.');
	const { email, password } = account('author');
	await signIn(page, email, password);
	await expect(page).toHaveURL(new RegExp(`/courses/${COURSE}/inverse-square$`));
	// a redirect to another site is ignored: the person lands where they work instead
	await signOut(page);
	await page.goto('/signin?redirectTo=%2F%2Fevil.example%2F');
	await signIn(page, email, password);
	await expect(page).toHaveURL(/\/author$/);
});
