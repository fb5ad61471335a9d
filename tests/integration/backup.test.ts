import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { createSequelize } from '../../src/lib/server/db/connection';

const source = process.env.DATABASE_URL as string;
const copyUrl = source.replace(/\/([^/]+)$/, '/$1_restored');
const dir = mkdtempSync(path.join(tmpdir(), 'crownbench-backup-'));

async function snapshot(db: Sequelize): Promise<Record<string, string>> {
	const tables = await db.query<{ name: string }>(
		`SELECT table_name::text AS name FROM information_schema.tables
		  WHERE table_schema = 'public' AND table_type = 'BASE TABLE' ORDER BY 1`,
		{ type: QueryTypes.SELECT }
	);
	const result: Record<string, string> = {};
	for (const { name } of tables) {
		// Row count and a checksum of every row's text, in a stable order.
		const [row] = await db.query<{ n: string; sum: string | null }>(
			`SELECT count(*) AS n, md5(string_agg(t::text, '|' ORDER BY t::text)) AS sum FROM "${name}" t`,
			{ type: QueryTypes.SELECT }
		);
		result[name] = `${row.n}:${row.sum ?? ''}`;
	}
	return result;
}

afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('npm run backup / npm run restore', () => {
	it('a restored copy holds the same rows as the original', async () => {
		const file = path.join(dir, 'test.dump');
		const admin = createSequelize(source.replace(/\/[^/]+$/, '/postgres'));
		const copyName = copyUrl.split('/').pop() as string;
		await admin.query(`DROP DATABASE IF EXISTS ${copyName}`);
		await admin.query(`CREATE DATABASE ${copyName}`);
		await admin.close();

		execFileSync('bash', ['scripts/backup.sh', 'backup', file], {
			env: { ...process.env, DATABASE_URL: source }
		});
		execFileSync('bash', ['scripts/backup.sh', 'restore', file, '--yes'], {
			env: { ...process.env, DATABASE_URL: copyUrl }
		});

		const original = createSequelize(source);
		const copy = createSequelize(copyUrl);
		try {
			const [a, b] = [await snapshot(original), await snapshot(copy)];
			expect(Object.keys(a).length).toBeGreaterThan(5);
			expect(b).toEqual(a);
		} finally {
			await original.close();
			await copy.close();
		}
	});

	it('refuses to restore without a file, changing nothing', () => {
		expect(() =>
			execFileSync('bash', ['scripts/backup.sh', 'restore'], {
				env: { ...process.env, DATABASE_URL: copyUrl },
				stdio: 'pipe'
			})
		).toThrow();
	});
});
