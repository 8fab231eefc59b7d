// A learner uploads a pair → sees the verdict → a mentor pins a comment and overrides → the learner reads the critique and gets the e-mail.
import { expect, test, type Browser, type Page } from '@playwright/test';
import { enrolDemoLearner, framePair } from './support/enrolled-learner';
import { expectVerbsFor } from './support/lrs';
import { COURSE, demoAccount, LESSON, type Role } from './support/screens';

const learner = enrolDemoLearner();

async function signIn(page: Page, role: Role, redirectTo = '/') {
	const { email, password } = demoAccount(role);
	await page.goto(`/signin?redirectTo=${encodeURIComponent(redirectTo)}`);
	await page.getByLabel('E-mail', { exact: true }).fill(email);
	await page.getByLabel('Password', { exact: true }).fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(new RegExp(`${redirectTo.replace(/[?]/g, '\\?')}$`));
}

async function asRole(browser: Browser, role: Role, path: string) {
	const context = await browser.newContext();
	const page = await context.newPage();
	await signIn(page, role, path);
	return { page, close: () => context.close() };
}

test('upload → verdict → mentor pin and override → critique and e-mail', async ({ page, browser }) => {
	test.setTimeout(120_000);
	const { reference, lit } = await framePair();

	await signIn(page, 'learner', `/courses/${COURSE}/${LESSON}`);
	const card = page.getByRole('region', { name: 'Assignment' });
	await expect(card.getByTestId('assignment-criteria').getByRole('listitem')).toHaveCount(4);
	await card.getByRole('link', { name: 'Upload your frames' }).click();
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Off the axis');

	// the browser refuses a wrong file and a missing frame before sending anything
	await page.getByTestId('frame-input-reference').setInputFiles({ name: 'notes.txt', mimeType: 'text/plain', buffer: Buffer.from('not a photo') });
	await expect(page.getByTestId('frame-error-reference')).toContainText('not a photo we can read');
	await page.getByTestId('frame-input-reference').setInputFiles({ name: 'reference.jpg', mimeType: 'image/jpeg', buffer: reference });
	await expect(page.getByTestId('frame-error-reference')).toHaveCount(0);
	await page.getByTestId('send-attempt').click();
	await expect(page.getByRole('alert')).toHaveText('Add the “lit” frame before sending.');

	await page.getByTestId('frame-input-lit').setInputFiles({ name: 'lit.jpg', mimeType: 'image/jpeg', buffer: lit });
	await expect(page.getByTestId('subject-box')).toBeVisible();
	// what flash was used (optional): a power that cannot be one is refused in the browser, with nothing sent
	await page.getByTestId('used-gn').fill('60');
	await page.getByTestId('used-power').fill('3');
	await page.getByTestId('used-distance').fill('3');
	await page.getByTestId('send-attempt').click();
	await expect(page.getByText('The flash power must be a fraction of full power')).toBeVisible();
	await page.getByTestId('used-power').fill('1/4');
	await page.getByTestId('send-attempt').click();

	await expect(page).toHaveURL(/\/attempts\/[0-9a-f-]{36}$/);
	const attemptUrl = page.url();
	// the status updates in place, then the verdict appears
	await expect(page.getByTestId('verdict-badge').first()).toHaveText('Passed', { timeout: 30_000 });
	await expect(page.getByTestId('criteria').getByTestId('criterion-verdict')).toHaveText(['Met', 'Met', 'Met', 'Met']);
	await expect(page.getByTestId('criterion-ambient-under')).toContainText('1.6 stops');
	await expect(page.getByTestId('exif-panel').nth(1)).toContainText('1/1500 s');
	await expect(page.getByTestId('histogram')).toHaveCount(2);
	await expect(page.getByTestId('stops-chart')).toBeVisible();
	// the evidence: the flash's share, the measured subject level beside the one predicted from what was used
	const lift = page.getByTestId('criterion-subject-lift');
	await expect(lift.getByTestId('evidence-share')).toContainText('%');
	await expect(lift.getByTestId('evidence-measured')).toContainText('over the ambient alone');
	await expect(lift.getByTestId('evidence-predicted')).toContainText('over the ambient alone');
	await expect(page.getByTestId('flash-used')).toContainText('guide number 60, 1/4 power, 3 m from the subject');
	// the clipped areas are drawn over the photo only when asked
	await expect(page.getByTestId('clipped-overlay')).toHaveCount(0);
	await page.getByTestId('toggle-clipped-lit').check();
	await expect(page.getByRole('region', { name: 'The lit frame' }).getByTestId('clipped-overlay')).toHaveCount(1);

	// the mentor's side
	const mentor = await asRole(browser, 'mentor', '/mentor');
	const row = mentor.page.getByTestId('review-table').getByRole('row').filter({ hasText: 'Robin Okafor (demo)' }).filter({ hasText: 'Off the axis' });
	await row.first().getByRole('link', { name: 'Robin Okafor (demo)', exact: true }).click();
	await expect(mentor.page.getByRole('heading', { level: 1 })).toHaveText('Off the axis');
	const litPhoto = mentor.page.getByRole('region', { name: 'The lit frame' }).getByTestId('photo-frame');
	await litPhoto.click({ position: { x: 60, y: 40 } });
	await mentor.page.getByTestId('pin-text-lit').fill('The key sits too close to the lens axis here.');
	// a double click makes one pin: the button waits for the first, the server keeps one per key
	await mentor.page.getByTestId('pin-save-lit').dblclick();
	await expect(mentor.page.getByRole('status').filter({ hasText: 'Pin 1 added.' })).toBeVisible();
	await expect(mentor.page.getByRole('region', { name: 'The lit frame' }).getByTestId('pin-1')).toBeVisible();
	await expect(mentor.page.getByTestId('pin-text-lit')).toHaveValue('');
	await expect(mentor.page.getByTestId('pin-2')).toHaveCount(0);
	// the rubric follows the assignment: no colour criterion, no colour item
	await expect(mentor.page.getByTestId('rubric')).toContainText('Shape and direction of the flash');
	await expect(mentor.page.getByTestId('rubric')).not.toContainText('Colour of the light');
	await mentor.page.getByTestId('rubric').getByRole('combobox', { name: /Ambient dimmed as planned/ }).selectOption('4');
	await mentor.page.getByTestId('critique-input').fill('Good ambient control. Move the light further round: 45 degrees or more from the axis.');
	await mentor.page.getByTestId('verdict-select').selectOption('fail');
	await mentor.page.getByTestId('override-reason').fill('The light is only about 20 degrees off the camera axis.');
	await mentor.page.getByTestId('send-review').click();
	await expect(mentor.page.getByRole('status').filter({ hasText: 'Review sent.' })).toContainText('The learner has been e-mailed.');
	await mentor.close();

	// the learner reads the critique
	await page.goto(attemptUrl);
	await expect(page.getByTestId('critique-text')).toHaveText('Good ambient control. Move the light further round: 45 degrees or more from the axis.');
	await expect(page.getByTestId('critique-heading')).toHaveText('Critique from Tess Lindqvist (demo)');
	await expect(page.getByTestId('pin-notes').getByRole('listitem')).toHaveCount(1);
	await expect(page.getByTestId('critique')).toContainText('4/4 Strong');
	await expect(page.getByTestId('pin-notes')).toContainText('The key sits too close to the lens axis here.');
	await expect(page.getByTestId('override-note')).toContainText('The light is only about 20 degrees off the camera axis.');
	await expect(page.getByTestId('pin-1')).toBeVisible();
	await expect(page.getByTestId('verdict-badge').first()).toHaveText('Not yet');

	// and the e-mail arrived in the demo mailbox
	const admin = await asRole(browser, 'admin', '/admin/mailbox');
	await admin.page
		.getByRole('listitem')
		.filter({ hasText: demoAccount('learner').email })
		.filter({ hasText: "Your mentor's critique: Off the axis" })
		.first()
		.getByRole('link')
		.click();
	await expect(admin.page.getByTestId('mail-text')).toContainText('The mentor changed the verdict to: not yet.');
	await admin.close();

	// the learner's records reached the LRS: the attempt, the automatic pass, the mentor's change and the critique
	const attemptId = attemptUrl.split('/').at(-1)!;
	const ADL = 'http://adlnet.gov/expapi/verbs/';
	const held = await expectVerbsFor(learner.id, [`${ADL}attempted`, `${ADL}passed`, `${ADL}failed`]);
	const aboutThis = (s: (typeof held)[number]) => JSON.stringify(s).includes(attemptId);
	expect(held.filter((s) => s.verb.id === `${ADL}attempted` && aboutThis(s))).toHaveLength(1);
	expect(held.filter((s) => s.verb.id === `${ADL}passed` && aboutThis(s))).toHaveLength(1);
	expect(held.filter((s) => s.verb.id === `${ADL}failed` && aboutThis(s))).toHaveLength(1);
	expect(held.filter((s) => s.verb.id.endsWith('/xapi/verbs/received-critique') && aboutThis(s))).toHaveLength(1);
});
