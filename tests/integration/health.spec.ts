import { expect, test } from 'vitest';
import { GET } from '../../src/routes/api/health/+server';

test('GET /api/health checks the database with a real query', async () => {
	const response = await GET();
	expect(response.status).toBe(200);
	const body = await response.json();
	expect(body).toMatchObject({ ok: true, db: 'up' });
	expect(typeof body.version).toBe('string');
});
