// Sending one statement to the LRS with @xapi/xapi (which sets X-Experience-API-Version and the credentials) over
// Node's fetch with a time limit; the answer's status is kept, so 409 and the kinds of failure can be told apart.
import XAPI, { type Statement } from '@xapi/xapi';
import type { LrsSettings } from './settings';

const TIME_LIMIT_MS = 10_000;

/** A failed exchange with the LRS: status null when no answer came (refused, reset, timed out). */
export class LrsError extends Error {
	constructor(
		message: string,
		readonly status: number | null
	) {
		super(message);
	}
}

interface AdapterCall {
	url: string;
	method: string;
	headers?: Record<string, string>;
	data?: unknown;
}

async function fetchAdapter<T>({ url, method, headers, data }: AdapterCall): Promise<{ data: T; headers: Record<string, string>; status: number }> {
	let response: Response;
	try {
		response = await fetch(url, {
			method,
			headers,
			body: data === undefined ? undefined : typeof data === 'string' ? data : JSON.stringify(data),
			signal: AbortSignal.timeout(TIME_LIMIT_MS)
		});
	} catch (error) {
		const cause = (error as { cause?: { code?: string; message?: string } }).cause;
		throw new LrsError(`No answer from the LRS: ${cause?.code ?? cause?.message ?? (error instanceof Error ? error.message : String(error))}`, null);
	}
	const text = await response.text().catch(() => '');
	if (!response.ok) throw new LrsError(`The LRS answered ${response.status}: ${text.replace(/\s+/g, ' ').slice(0, 300)}`, response.status);
	let body: unknown = text;
	try {
		body = text ? JSON.parse(text) : '';
	} catch {
		// not JSON: keep the text
	}
	return { data: body as T, headers: Object.fromEntries(response.headers.entries()), status: response.status };
}

export interface SendOutcome {
	status: number;
	/** the LRS already held a statement with this id (409): ours, sent before */
	alreadyHeld: boolean;
}

/** Sends one statement (POST /statements, its id inside): 200 stored or already held unchanged, 409 held with other content. */
export async function sendStatement(settings: LrsSettings, statement: Statement & { id: string }): Promise<SendOutcome> {
	const xapi = new XAPI({ endpoint: settings.endpoint, auth: settings.auth, version: '1.0.3', adapter: fetchAdapter });
	try {
		const answer = await xapi.sendStatement({ statement });
		return { status: answer.status, alreadyHeld: false };
	} catch (error) {
		if (error instanceof LrsError && error.status === 409) return { status: 409, alreadyHeld: true };
		throw error;
	}
}
