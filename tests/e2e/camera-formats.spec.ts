// A learner sends a phone's HEIC as the reference and a camera's raw (DNG) as the lit frame: both decoded, measured and graded.
import { expect, test } from '@playwright/test';
import { makeDng } from '../../src/lib/server/analysis/test-dng';
import { makeHeic } from '../../src/lib/server/analysis/test-heic';
import { REFERENCE_EXIF } from '../../src/lib/server/analysis/test-frames';
import { enrolDemoLearner } from './support/enrolled-learner';
import { COURSE, demoAccount, LESSON } from './support/screens';

enrolDemoLearner();
const learner = demoAccount('learner');

test('a HEIC reference and a DNG lit frame are graded with their pixels measured', async ({ page }) => {
	test.setTimeout(120_000);
	// reference 1/500 s, lit 1/1500 s: log2(3) ≈ 1.6 stops under (APEX, ASA PH2.5-1960), flash holding the subject at mid-grey
	const size = { width: 900, height: 600 };
	const reference = await makeHeic({ ...size, subject: { stops: 0 }, background: { stops: 0.5 }, exif: { ...REFERENCE_EXIF } });
	const lit = makeDng({ ...size, cfa: true, subject: { stops: 0 }, background: { stops: 0.5 - Math.log2(3) }, exif: { ...REFERENCE_EXIF, exposureTime: 1 / 1500, flash: 0x19 } });

	await page.goto(`/signin?redirectTo=${encodeURIComponent(`/courses/${COURSE}/${LESSON}`)}`);
	await page.getByLabel('E-mail', { exact: true }).fill(learner.email);
	await page.getByLabel('Password', { exact: true }).fill(learner.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await page.getByRole('region', { name: 'Assignment' }).getByRole('link', { name: 'Upload your frames' }).click();

	await page.getByTestId('frame-input-reference').setInputFiles({ name: 'IMG_0001.HEIC', mimeType: 'image/heic', buffer: reference });
	await page.getByTestId('frame-input-lit').setInputFiles({ name: 'DSC_0002.DNG', mimeType: '', buffer: lit });
	await expect(page.getByTestId('frame-error-reference')).toHaveCount(0);
	await expect(page.getByTestId('frame-error-lit')).toHaveCount(0);
	await page.getByTestId('send-attempt').click();

	await expect(page).toHaveURL(/\/attempts\/[0-9a-f-]{36}$/);
	await expect(page.getByTestId('verdict-badge').first()).toHaveText('Passed', { timeout: 60_000 });
	await expect(page.getByTestId('criteria').getByTestId('criterion-verdict')).toHaveText(['Met', 'Met', 'Met', 'Met']);
	await expect(page.getByTestId('criterion-ambient-under')).toContainText('1.6 stops');
	await expect(page.getByTestId('exif-panel').nth(1)).toContainText('1/1500 s');
	await expect(page.getByTestId('histogram')).toHaveCount(2);
});
