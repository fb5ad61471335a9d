import { execFile } from 'node:child_process';
import path from 'node:path';
import { promisify } from 'node:util';

const run = promisify(execFile);

/** The project folder (tests/faults/support is three levels down). */
export const projectDir = path.resolve(import.meta.dirname, '../../..');

/** Where the fault tests keep their cluster (unless CB_FAULT_DB_DIR says otherwise) and logs. */
export const faultsDir = path.join(projectDir, '.data/faults');

/** The shared cluster of the test command and the demo: fault tests never stop or restart it. */
const SHARED_PORT = 54329;

/**
 * A PostgreSQL cluster of the fault tests' own, run by ./docker-less-db.sh with its own data folder
 * and port, so that stopping and restarting it touches nobody else's databases.
 */
export interface PrivateCluster {
	dir: string;
	port: number;
}

/** Refuses a cluster that is, or may be, the shared one. */
export function checkPrivate(cluster: PrivateCluster): void {
	const shared = [process.env.CB_DB_DIR, path.join(projectDir, '.data/pg')]
		.filter((d): d is string => Boolean(d))
		.map((d) => path.resolve(d));
	const sharedPorts = [SHARED_PORT, Number(process.env.CB_DB_PORT ?? SHARED_PORT)];
	if (shared.includes(path.resolve(cluster.dir)) || sharedPorts.includes(cluster.port)) {
		throw new Error(
			`the fault tests need a private cluster: ${cluster.dir} on port ${cluster.port} is the shared one`
		);
	}
}

async function dbScript(cluster: PrivateCluster, args: string[]): Promise<string> {
	checkPrivate(cluster);
	const { stdout } = await run(path.join(projectDir, 'docker-less-db.sh'), args, {
		cwd: projectDir,
		env: { ...process.env, CB_DB_DIR: cluster.dir, CB_DB_PORT: String(cluster.port) }
	});
	return stdout.trim();
}

/** Starts the cluster (creating it the first time) and creates the databases; waits until it runs. */
export async function startCluster(
	cluster: PrivateCluster,
	databases: string[] = []
): Promise<void> {
	await dbScript(cluster, ['start', ...databases]);
}

/** Stops the cluster (fast shutdown: sessions are ended) and waits until it has stopped. */
export async function stopCluster(cluster: PrivateCluster): Promise<void> {
	await dbScript(cluster, ['stop']);
}

/** The connection URL of a database of the cluster. */
export function clusterUrl(cluster: PrivateCluster, database: string): string {
	return `postgres://postgres@127.0.0.1:${cluster.port}/${database}`;
}

/** Empties a database, then runs the migrations and the demo seed (scripts/db.ts reset). */
export async function resetDatabase(url: string): Promise<void> {
	await run('npx', ['tsx', 'scripts/db.ts', 'reset'], {
		cwd: projectDir,
		env: { ...process.env, DATABASE_URL: url }
	});
}
