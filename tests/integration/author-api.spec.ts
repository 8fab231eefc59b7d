// The editor's helpers: the live preview renders as learners will see it; the spec check locates errors by path.
import { describe, expect, test } from 'vitest';
import { POST as preview } from '../../src/routes/api/v1/author/preview/+server';
import { POST as specCheck } from '../../src/routes/api/v1/author/spec-check/+server';
import { makeEvent, throughHooks, valueOf } from './support/request-event';
import { demoAccount, signedInCookies } from './support/people';

async function call(handler: (e: never) => Response | Promise<Response>, path: string, json: unknown) {
	const cookies = await signedInCookies(demoAccount('author').email);
	const outcome = await throughHooks(makeEvent({ path, cookies, json }), (e) => handler(e as never));
	const response = valueOf<Response>(outcome);
	return { status: response.status, body: await response.json() };
}

describe('POST /api/v1/author/preview', () => {
	test('answers with sanitised segments and the problems found', async () => {
		const res = await call(preview, '/api/v1/author/preview', { body: 'Hi <b onclick="x()">there</b>\n\n<SyncGate shutter="1/1000" sync="1/250" />\n\n<Nope />' });
		expect(res).toEqual({
			status: 200,
			body: {
				segments: [
					{ kind: 'html', html: '<p>Hi <b>there</b></p>' },
					{ kind: 'widget', name: 'SyncGate', props: { shutter: '1/1000', sync: '1/250' } }
				],
				problems: [expect.stringMatching(/event handler/), expect.stringMatching(/<Nope> is not a lesson widget/)]
			}
		});
	});

	test('refuses a body that is not text', async () => {
		expect((await call(preview, '/api/v1/author/preview', { body: 42 })).status).toBe(400);
	});
});

describe('POST /api/v1/author/spec-check', () => {
	test('a valid spec: no errors, criteria in plain words', async () => {
		const spec = JSON.stringify({ frames: ['ambient', 'lit'], criteria: [{ kind: 'shutter-min', seconds: 0.001 }] });
		const res = await call(specCheck, '/api/v1/author/spec-check', { spec });
		expect(res.body).toEqual({
			errors: [],
			frames: ['ambient', 'lit'],
			criteria: ['Use a shutter speed of 1/1000 s or faster.'],
			// the defaults for a shutter limit, with the moment always scored
			rubric: [
				{ id: 'moment', label: 'Moment and sharpness' },
				{ id: 'settings', label: 'Camera settings' }
			]
		});
	});

	test('errors carry their path; the readable criteria are still described', async () => {
		const spec = JSON.stringify({ frames: ['lit'], criteria: [{ kind: 'iso-max', iso: 400 }, { kind: 'ambient-under', stops: 'two' }] });
		const res = await call(specCheck, '/api/v1/author/spec-check', { spec });
		expect(res.body.errors).toContainEqual({ path: 'criteria[1].stops', message: 'must be a number' });
		expect(res.body.criteria).toEqual(['Keep the ISO at 400 or lower.', 'This criterion is not complete yet: check its fields.']);
	});

	test('broken JSON is an error at the top, not a failure', async () => {
		const res = await call(specCheck, '/api/v1/author/spec-check', { spec: '{"frames": [' });
		expect(res.status).toBe(200);
		expect(res.body.errors).toEqual([{ path: '', message: expect.stringMatching(/^is not valid JSON/) }]);
	});
});
