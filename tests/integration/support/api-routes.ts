// Every API route on disk (src/routes/api/**/+server.ts), so tests that walk them cannot miss a new one.
import { readdirSync, statSync } from 'node:fs';
import { join, relative, resolve, sep } from 'node:path';

export const httpMethods = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS', 'HEAD'] as const;

export interface ApiRoute {
	file: string;
	/** path segments below /api as written on disk, route groups left out: ['v1', 'attempts', '[id]'] */
	parts: string[];
	/** the route id as SvelteKit writes it: '/api/v1/attempts/[id]' */
	id: string;
}

const apiRoot = resolve('src/routes/api');

function findServerFiles(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const full = join(dir, name);
		if (statSync(full).isDirectory()) return findServerFiles(full);
		return name === '+server.ts' || name === '+server.js' ? [full] : [];
	});
}

export function listApiRoutes(): ApiRoute[] {
	return findServerFiles(apiRoot).map((file) => {
		const parts = relative(apiRoot, file).split(sep).slice(0, -1).filter((p) => !/^\(.*\)$/.test(p));
		return { file, parts, id: ['/api', ...parts].join('/') };
	});
}
