import { readdirSync, statSync } from 'node:fs';
import path from 'node:path';

/** Every route id of the app (pages and endpoints), read from src/routes. */
export function listRouteIds(root = path.join(process.cwd(), 'src/routes')): string[] {
	const ids: string[] = [];
	const walk = (dir: string, id: string): void => {
		const names = readdirSync(dir);
		if (
			names.some(
				(n) => /^\+(page|server)\.(svelte|ts|js)$/.test(n) || /^\+page\.server\.(ts|js)$/.test(n)
			)
		) {
			ids.push(id === '' ? '/' : id);
		}
		for (const name of names) {
			const full = path.join(dir, name);
			if (!statSync(full).isDirectory()) continue;
			// Route groups "(name)" do not appear in URLs.
			const segment = /^\(.*\)$/.test(name) ? '' : `/${name}`;
			walk(full, id + segment);
		}
	};
	walk(root, '');
	return [...new Set(ids)].sort();
}
