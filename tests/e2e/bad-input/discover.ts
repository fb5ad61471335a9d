import { readFileSync } from 'node:fs';
import path from 'node:path';
import ts from 'typescript';
import { listRouteIds } from '../access/routes';

/** One thing a client can send input to: a form action of a page, or a method of an endpoint. */
export interface InputTarget {
	route: string;
	kind: 'action' | 'api';
	/** The action's name ('default' for the unnamed one) or the HTTP method. */
	name: string;
}

export const targetKey = (t: InputTarget): string => `${t.route} ${t.kind}:${t.name}`;

const routeDir = (root: string, route: string): string =>
	path.join(root, route === '/' ? '' : route.slice(1));

/** The property names of `export const actions = { ... }`, read with the TypeScript parser. */
function actionNames(file: string): string[] {
	const source = ts.createSourceFile(file, readFileSync(file, 'utf8'), ts.ScriptTarget.Latest);
	const names: string[] = [];
	for (const statement of source.statements) {
		if (!ts.isVariableStatement(statement)) continue;
		if (!statement.modifiers?.some((m) => m.kind === ts.SyntaxKind.ExportKeyword)) continue;
		for (const decl of statement.declarationList.declarations) {
			if (!ts.isIdentifier(decl.name) || decl.name.text !== 'actions') continue;
			let init = decl.initializer;
			while (init && (ts.isSatisfiesExpression(init) || ts.isAsExpression(init)))
				init = init.expression;
			if (!init || !ts.isObjectLiteralExpression(init))
				throw new Error(`${file}: actions is not an object literal`);
			for (const prop of init.properties) {
				if (prop.name && (ts.isIdentifier(prop.name) || ts.isStringLiteral(prop.name)))
					names.push(prop.name.text);
			}
		}
	}
	return names;
}

/** The HTTP methods an endpoint exports (GET, POST, ...). */
function endpointMethods(file: string): string[] {
	const text = readFileSync(file, 'utf8');
	const found = text.matchAll(
		/export\s+(?:const|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE)\b/g
	);
	return [...new Set([...found].map((m) => m[1]))];
}

/** Every form action and endpoint method of the app, read from src/routes. */
export function listInputTargets(root = path.join(process.cwd(), 'src/routes')): InputTarget[] {
	const targets: InputTarget[] = [];
	for (const route of listRouteIds(root)) {
		const dir = routeDir(root, route);
		for (const ext of ['ts', 'js']) {
			const page = path.join(dir, `+page.server.${ext}`);
			try {
				for (const name of actionNames(page)) targets.push({ route, kind: 'action', name });
			} catch (e) {
				if ((e as NodeJS.ErrnoException).code !== 'ENOENT') throw e;
			}
			const server = path.join(dir, `+server.${ext}`);
			try {
				for (const name of endpointMethods(server)) targets.push({ route, kind: 'api', name });
			} catch (e) {
				if ((e as NodeJS.ErrnoException).code !== 'ENOENT') throw e;
			}
		}
	}
	return targets;
}
