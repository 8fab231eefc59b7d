// Paid enrolment in the browser: a fresh learner pays on the local fake's payment page and opens a paid lesson;
// a declined card leaves another without access and with a clear message.
import { expect, test, type Page } from '@playwright/test';
import { signUpAndConfirm } from './support/sign-up';

const course = '/courses/daylight-flash-for-action';
const paidLesson = `${course}/equivalent-exposures`;
const unique = () => `${Date.now()}-${Math.floor(Math.random() * 1e6)}`;

/** Fresh learners (test runs share one database), so nobody else's enrolment is touched. */
async function signUp(page: Page, name: string) {
	const email = `e2e-pay-${unique()}@test.example`;
	await signUpAndConfirm(page, name, email, 'strobes in the rain');
	await expect(page.getByText(`${email} is verified`)).toBeVisible();
	return email;
}

async function startCheckout(page: Page) {
	await page.goto(course);
	await expect(page.getByRole('heading', { name: 'Enrol in this course' })).toBeVisible();
	await page.getByRole('button', { name: 'Enrol — $149.00' }).click();
	// the fake's own payment page, on another port
	await expect(page).toHaveURL(/\/pay\/cs_test_/);
	await expect(page.getByRole('heading', { name: 'Pay $149.00' })).toBeVisible();
}

test('a learner enrols through the payment page and opens a paid lesson', async ({ page }) => {
	const email = await signUp(page, 'Ines Marlow');
	// before paying, a members-only lesson offers enrolment instead of its text
	await page.goto(paidLesson);
	await expect(page).toHaveURL(`${course}?locked=equivalent-exposures`);
	await expect(page.getByText('“Equivalent exposures” opens once you are enrolled in this course.')).toBeVisible();
	await expect(page.getByText('EV100 = log2')).toHaveCount(0);

	await startCheckout(page);
	await expect(page.getByText(`Receipt to ${email}`)).toBeVisible();
	await page.getByLabel('Card number').fill('4242 4242 4242 4242');
	await page.getByRole('button', { name: 'Pay $149.00' }).click();

	await expect(page).toHaveURL(/\/checkout\/done\?session_id=cs_test_/);
	await expect(page.getByRole('heading', { name: "You're enrolled" })).toBeVisible();
	await page.getByRole('link', { name: 'Go to the course' }).click();
	await expect(page.getByRole('heading', { name: "You're enrolled" })).toBeVisible();

	await page.goto(paidLesson);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Equivalent exposures');
	await expect(page.getByText('EV100 = log2(N² ÷ t)')).toBeVisible();

	await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Billing' }).click();
	await expect(page.getByRole('heading', { name: 'Billing' })).toBeVisible();
	await expect(page.getByRole('cell', { name: 'paid', exact: true })).toBeVisible();
	await page.getByRole('link', { name: 'Receipt' }).click();
	await expect(page.getByRole('heading', { name: 'Receipt' })).toBeVisible();
	await expect(page.getByText('$149.00')).toBeVisible();
});

test('a declined card leaves the learner without access and with a clear message', async ({ page }) => {
	await signUp(page, 'Teo Brannock');
	await startCheckout(page);
	await page.getByLabel('Card number').fill('4000 0000 0000 0002');
	await page.getByRole('button', { name: 'Pay $149.00' }).click();
	await expect(page.getByRole('alert')).toHaveText('Your card was declined.');

	await page.getByRole('button', { name: 'Cancel' }).click();
	await expect(page).toHaveURL(`${course}?checkout=cancelled`);
	await expect(page.getByRole('alert')).toContainText('nothing was charged and you are not enrolled');
	await expect(page.getByRole('button', { name: 'Enrol — $149.00' })).toBeVisible();

	await page.goto(paidLesson);
	await expect(page).toHaveURL(`${course}?locked=equivalent-exposures`);
	await expect(page.getByText('EV100 = log2')).toHaveCount(0);
});

test('signed out, the course page offers sign-in; open lessons still open', async ({ page }) => {
	await page.goto(course);
	await expect(page.getByRole('link', { name: 'Sign in to enrol' })).toHaveAttribute('href', `/signin?redirectTo=${encodeURIComponent(course)}`);
	await page.goto(`${course}/what-a-stop-is`);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('What a stop is');
});
