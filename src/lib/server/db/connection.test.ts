import { describe, expect, it } from 'vitest';
import { ConnectionRefusedError, DatabaseError, UniqueConstraintError } from 'sequelize';
import { isDatabaseDown } from './connection';

/** A driver error as pg raises it: an Error with the server's SQLSTATE in `code`. */
function pgError(message: string, code?: string): Error & { code?: string; sql: string } {
	return Object.assign(new Error(message), { code, sql: 'SELECT 1' });
}

// SQLSTATE codes from PostgreSQL's error code appendix (common practice): class 08 is
// "connection exception", 57P01..57P03 are admin shutdown, crash shutdown and cannot connect now.
describe('isDatabaseDown', () => {
	it.each([
		[
			'connection refused (not running)',
			new ConnectionRefusedError(pgError('connect ECONNREFUSED', 'ECONNREFUSED'))
		],
		[
			'server shutting down (57P01)',
			new DatabaseError(pgError('terminating connection due to administrator command', '57P01'))
		],
		[
			'server starting up (57P03)',
			new DatabaseError(pgError('the database system is starting up', '57P03'))
		],
		['connection failure (08006)', new DatabaseError(pgError('connection failure', '08006'))],
		[
			'connection lost under a query',
			new DatabaseError(pgError('Connection terminated unexpectedly'))
		],
		['connection reset under a query', new DatabaseError(pgError('read ECONNRESET', 'ECONNRESET'))]
	])('%s: yes', (_name, error) => {
		expect(isDatabaseDown(error)).toBe(true);
	});

	it.each([
		[
			'a unique violation (23505)',
			new UniqueConstraintError({ parent: pgError('duplicate key', '23505') })
		],
		['a syntax error (42601)', new DatabaseError(pgError('syntax error', '42601'))],
		['an error of our own', new Error('Something else')],
		['a connection reset by another server (mail, say)', pgError('read ECONNRESET', 'ECONNRESET')],
		['nothing', null]
	])('%s: no', (_name, error) => {
		expect(isDatabaseDown(error)).toBe(false);
	});
});
