// Every page route with server code on disk (src/routes/**/+page.server.ts) and its form actions, so walks cannot miss one.
import { readdirSync, statSync } from 'node:fs';
import { join, relative, resolve, sep } from 'node:path';

export interface PageRoute {
	file: string;
	/** the route id as SvelteKit writes it, groups included: '/(mentor)/mentor/attempts/[id]' */
	id: string;
	/** parameter names with their matchers: [['id', 'integer']] */
	params: [name: string, matcher: string | null][];
	/** the URL path with each parameter replaced by `fill(name, matcher)` */
	path: (fill: (name: string, matcher: string | null) => string) => string;
}

const routesRoot = resolve('src/routes');

function findPageServers(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const full = join(dir, name);
		if (statSync(full).isDirectory()) return findPageServers(full);
		return name === '+page.server.ts' ? [full] : [];
	});
}

export function listPageRoutes(): PageRoute[] {
	return findPageServers(routesRoot).map((file) => {
		const parts = relative(routesRoot, file).split(sep).slice(0, -1);
		const params = parts.flatMap((p) => {
			const m = /^\[\.{0,3}(\w+)(?:=(\w+))?\]$/.exec(p);
			return m ? [[m[1], m[2] ?? null] as [string, string | null]] : [];
		});
		return {
			file,
			id: '/' + parts.join('/'),
			params,
			path: (fill) =>
				'/' +
				parts
					.filter((p) => !/^\(.*\)$/.test(p))
					.map((p) => {
						const m = /^\[\.{0,3}(\w+)(?:=(\w+))?\]$/.exec(p);
						return m ? encodeURIComponent(fill(m[1], m[2] ?? null)) : p;
					})
					.join('/')
		};
	});
}
