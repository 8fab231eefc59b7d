// Builds SvelteKit request events for integration tests and runs them through the app's real session hook.
import type { Cookies, RequestEvent } from '@sveltejs/kit';
import { isHttpError, isRedirect } from '@sveltejs/kit';
// `handle` is a sequence that needs Kit's request store; these are its parts that refuse bad input and set locals
import { authenticate } from '../../../src/hooks.server';
import { guardInput } from '$lib/server/edge/guard-input';

/** A cookie jar with the parts of Kit's Cookies the app uses; keeps what the server sets. */
export type TestCookies = Cookies & { jar: Map<string, string>; options: Map<string, Record<string, unknown>> };

export function makeCookies(initial: Record<string, string> = {}): TestCookies {
	const jar = new Map(Object.entries(initial));
	const options = new Map<string, Record<string, unknown>>();
	const cookies = {
		jar,
		options,
		get: (name: string) => jar.get(name),
		getAll: () => [...jar].map(([name, value]) => ({ name, value })),
		set: (name: string, value: string, opts: { maxAge?: number }) => {
			options.set(name, { ...opts });
			if (value === '' || opts?.maxAge === 0) jar.delete(name);
			else jar.set(name, value);
		},
		delete: (name: string) => void jar.delete(name),
		serialize: (name: string, value: string) => `${name}=${value}`
	};
	return cookies as unknown as TestCookies;
}

type EventInit = {
	method?: string;
	path: string;
	form?: Record<string, string | string[]>;
	/** a JSON body (sent with content-type application/json); `rawBody` sends text as given */
	json?: unknown;
	rawBody?: string;
	cookies?: TestCookies;
	address?: string;
	params?: Record<string, string>;
	routeId?: string;
	headers?: Record<string, string>;
};

export const origin = 'http://localhost:4173';

export function makeEvent(init: EventInit): RequestEvent {
	const url = new URL(init.path, origin);
	let body: FormData | undefined;
	if (init.form) {
		body = new FormData();
		for (const [k, v] of Object.entries(init.form)) for (const one of [v].flat()) body.append(k, one);
	}
	const text = init.json !== undefined ? JSON.stringify(init.json) : init.rawBody;
	const request = new Request(url, {
		method: init.method ?? (body || text !== undefined ? 'POST' : 'GET'),
		body: body ?? text,
		headers: { origin, ...(text !== undefined ? { 'content-type': 'application/json' } : {}), ...init.headers }
	});
	const event = {
		request,
		url,
		params: init.params ?? {},
		route: { id: init.routeId ?? null },
		locals: {} as App.Locals,
		cookies: init.cookies ?? makeCookies(),
		getClientAddress: () => init.address ?? '192.0.2.1',
		setHeaders: () => {},
		fetch: globalThis.fetch,
		platform: undefined,
		isDataRequest: false,
		isSubRequest: false,
		isRemoteRequest: false
	};
	return event as unknown as RequestEvent;
}

export type Outcome<T> =
	| { kind: 'value'; value: T }
	| { kind: 'redirect'; status: number; location: string }
	| { kind: 'error'; status: number; message: string };

/**
 * Runs `fn` behind the app's input gate and inside its session hook (so locals come from the real session code)
 * and reports how it ended; a request the gate refuses ends as an error with the gate's status and message.
 */
export async function throughHooks<T>(event: RequestEvent, fn: (e: RequestEvent) => T | Promise<T>): Promise<Outcome<T>> {
	let value: T | undefined;
	let reached = false;
	try {
		const response = await guardInput({
			event,
			resolve: (gated) =>
				authenticate({
					event: gated,
					resolve: async (e) => {
						reached = true;
						value = await fn(e);
						return value instanceof Response ? value : new Response(null);
					}
				})
		});
		if (!reached) return { kind: 'error', status: response.status, message: await refusalMessage(response) };
		return { kind: 'value', value: value as T };
	} catch (e) {
		if (isRedirect(e)) return { kind: 'redirect', status: e.status, location: e.location };
		if (isHttpError(e)) return { kind: 'error', status: e.status, message: e.body.message };
		throw e;
	}
}

async function refusalMessage(response: Response): Promise<string> {
	const text = await response.text();
	try {
		const body = JSON.parse(text) as { message?: string; error?: { message?: string } };
		return body.message ?? body.error?.message ?? text;
	} catch {
		return text;
	}
}

/** An action's `fail(...)` result, unwrapped. */
export function failureOf(value: unknown): { status: number; data: Record<string, unknown> } | null {
	const v = value as { status?: number; data?: Record<string, unknown> } | null;
	return v && typeof v.status === 'number' && v.data ? { status: v.status, data: v.data } : null;
}

/** The value an outcome ended with; throws (failing the test) on a redirect or an error. */
export function valueOf<T>(outcome: Outcome<unknown>): T {
	if (outcome.kind !== 'value') throw new Error(`expected a value, got ${JSON.stringify(outcome)}`);
	return outcome.value as T;
}
