// What the Learning Record Store fake (fakes/lrs) holds for one person, read from its GET /statements as any LRS client would.
import { expect } from '@playwright/test';

type Stored = { id: string; actor: { account?: { name?: string } }; verb: { id: string }; object: { id: string } };

/** The bootstrap points the app at the fake through these; a spec run by hand sets them the same way. */
function lrs() {
	const endpoint = process.env.STOPWISE_LRS_ENDPOINT;
	if (!endpoint) throw new Error('STOPWISE_LRS_ENDPOINT is not set: start the LRS fake (npm test does) and point the app at it');
	const auth = Buffer.from(`${process.env.STOPWISE_LRS_USER ?? ''}:${process.env.STOPWISE_LRS_PASSWORD ?? ''}`).toString('base64');
	return { statements: `${endpoint.replace(/\/?$/, '/')}statements`, headers: { 'X-Experience-API-Version': '1.0.3', Authorization: `Basic ${auth}` } };
}

/** The statements about one user (their account name is the user id), oldest first. */
export async function statementsAbout(userId: string): Promise<Stored[]> {
	const { statements, headers } = lrs();
	const response = await fetch(`${statements}?ascending=true`, { headers });
	expect(response.status).toBe(200);
	const body = (await response.json()) as { statements: Stored[] };
	return body.statements.filter((s) => s.actor.account?.name === userId);
}

/** Waits until the LRS holds a statement with each of these verbs for the user (delivery runs in the background). */
export async function expectVerbsFor(userId: string, verbs: string[]): Promise<Stored[]> {
	let found: Stored[] = [];
	await expect
		.poll(
			async () => {
				found = await statementsAbout(userId);
				return verbs.every((v) => found.some((s) => s.verb.id === v));
			},
			{ message: `the LRS holds ${verbs.join(', ')} for ${userId}`, timeout: 30_000 }
		)
		.toBe(true);
	return found;
}
