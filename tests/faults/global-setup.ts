import { existsSync, mkdirSync, readdirSync, rmSync } from 'node:fs';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import {
	clusterUrl,
	faultsDir,
	projectDir,
	resetDatabase,
	startCluster,
	stopCluster,
	type PrivateCluster
} from './support/cluster';
import { portFromEnv } from './support/ports';

/** The one database of the fault tests, in their private cluster. */
const DATABASE = 'crownbench_faults';

declare module 'vitest' {
	export interface ProvidedContext {
		faultCluster: PrivateCluster & { databaseUrl: string };
	}
}

/**
 * Starts a private PostgreSQL cluster (CB_FAULT_DB_DIR, default .data/faults/pg; CB_FAULT_DB_PORT,
 * default a free port), migrates and seeds the demo into it, and stops it when the run ends.
 * The tests stop and restart this cluster; the shared one is never touched.
 */
export default async function setup(project: TestProject): Promise<() => Promise<void>> {
	if (!existsSync(path.join(projectDir, 'build/index.js'))) {
		throw new Error('The fault tests run the built app: run `npx vite build` first.');
	}
	const cluster: PrivateCluster = {
		dir: path.resolve(process.env.CB_FAULT_DB_DIR ?? path.join(faultsDir, 'pg')),
		port: await portFromEnv('CB_FAULT_DB_PORT')
	};
	// A cluster left running by an interrupted run may listen on another port: stop it first.
	await stopCluster(cluster);
	// Logs of this run only: the cluster's (postgres-<port>.log), the apps' and the SMTP fake's.
	mkdirSync(faultsDir, { recursive: true });
	for (const name of readdirSync(faultsDir)) {
		if (name.endsWith('.log')) rmSync(path.join(faultsDir, name));
	}
	await startCluster(cluster, [DATABASE]);
	const databaseUrl = clusterUrl(cluster, DATABASE);
	await resetDatabase(databaseUrl);
	project.provide('faultCluster', { ...cluster, databaseUrl });
	return () => stopCluster(cluster);
}
