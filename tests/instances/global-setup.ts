import { existsSync, mkdirSync, readdirSync, rmSync } from 'node:fs';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import {
	clusterUrl,
	projectDir,
	resetDatabase,
	startCluster,
	stopCluster,
	type PrivateCluster
} from '../faults/support/cluster';
import { portFromEnv } from '../faults/support/ports';

/** Where these tests keep their cluster and the logs of their processes. */
export const instancesDir = path.join(projectDir, '.data/instances');

const DATABASE = 'crownbench_instances';

declare module 'vitest' {
	export interface ProvidedContext {
		instancesCluster: PrivateCluster & { databaseUrl: string };
	}
}

/**
 * Starts a PostgreSQL cluster of these tests' own (CB_INSTANCES_DB_DIR, default
 * .data/instances/pg; CB_INSTANCES_DB_PORT, default a free port) with the demo seed, and stops it
 * when the run ends.
 */
export default async function setup(project: TestProject): Promise<() => Promise<void>> {
	if (!existsSync(path.join(projectDir, 'build/index.js'))) {
		throw new Error('The instance tests run the built app: run `npx vite build` first.');
	}
	const cluster: PrivateCluster = {
		dir: path.resolve(process.env.CB_INSTANCES_DB_DIR ?? path.join(instancesDir, 'pg')),
		port: await portFromEnv('CB_INSTANCES_DB_PORT')
	};
	await stopCluster(cluster);
	mkdirSync(instancesDir, { recursive: true });
	for (const name of readdirSync(instancesDir)) {
		if (name.endsWith('.log')) rmSync(path.join(instancesDir, name));
	}
	await startCluster(cluster, [DATABASE]);
	const databaseUrl = clusterUrl(cluster, DATABASE);
	await resetDatabase(databaseUrl);
	project.provide('instancesCluster', { ...cluster, databaseUrl });
	return () => stopCluster(cluster);
}
