import { json } from '@sveltejs/kit';
import { version } from '$app/environment';
import { checkHealth } from '$lib/server/health';

export const GET = async () => {
	const health = await checkHealth();
	return json({ ...health, version }, { status: health.ok ? 200 : 503 });
};
