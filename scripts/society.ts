/**
 * Starts a society from the command line (for a host where only its operator starts them):
 *   npm run society -- create --name "Lakeside Violet Society" --slug lakeside-violets \
 *     --admin someone@example.org [--admin-name "..."] [--country US] [--unit in|cm]
 *     [--paper letter|a4] [--time-zone America/Chicago] [--currency USD]
 * The admin's account is created when the address has none. Exit code 2 on bad input.
 */
import { parseArgs } from 'node:util';
import { z } from 'zod';
import { DEFAULT_SOCIETY_SETTINGS } from '../src/lib/domain/society-settings';
import { startSocietySchema } from '../src/lib/schemas/society';
import { DATABASE_DOWN_HINT, isDatabaseDown } from '../src/lib/server/db/connection';
import { sequelize } from '../src/lib/server/db';
import { SocietyError, startSociety } from '../src/lib/server/people/societies';

const USAGE = `usage: npm run society -- create --name "Society name" --slug short-name --admin someone@example.org
       [--admin-name "Their name"] [--country US] [--unit in|cm] [--paper letter|a4]
       [--time-zone America/Chicago] [--currency USD]`;

const adminEmail = z
	.string()
	.trim()
	.toLowerCase()
	.pipe(z.email('--admin needs a complete e-mail address, like someone@example.org.'));

class BadInput extends Error {}

function readArgs(argv: string[]) {
	let parsed;
	try {
		parsed = parseArgs({
			args: argv,
			allowPositionals: true,
			strict: true,
			options: {
				name: { type: 'string' },
				slug: { type: 'string' },
				admin: { type: 'string' },
				'admin-name': { type: 'string' },
				country: { type: 'string' },
				unit: { type: 'string' },
				paper: { type: 'string' },
				'time-zone': { type: 'string' },
				currency: { type: 'string' },
				help: { type: 'boolean' }
			}
		});
	} catch (err) {
		throw new BadInput(err instanceof Error ? err.message : String(err));
	}
	const { values, positionals } = parsed;
	if (values.help) return null;
	if (positionals[0] !== 'create' || positionals.length !== 1) {
		throw new BadInput(
			positionals.length ? `unknown command: ${positionals.join(' ')}` : 'no command given'
		);
	}
	const d = DEFAULT_SOCIETY_SETTINGS;
	const fields = startSocietySchema.safeParse({
		name: values.name,
		slug: values.slug,
		country: (values.country ?? d.country).toUpperCase(),
		unit: values.unit ?? d.lengthUnit,
		paperSize: (values.paper ?? d.paperSize).toLowerCase(),
		timeZone: values['time-zone'] ?? d.timeZone,
		currency: (values.currency ?? d.currency).toUpperCase()
	});
	const email = adminEmail.safeParse(values.admin ?? '');
	const problems: string[] = [];
	if (!fields.success) {
		const flags: Record<string, string> = { paperSize: 'paper', timeZone: 'time-zone' };
		for (const issue of fields.error.issues) {
			const key = String(issue.path[0]);
			problems.push(`--${flags[key] ?? key}: ${issue.message}`);
		}
	}
	if (!email.success) problems.push(email.error.issues[0].message);
	if (!fields.success || !email.success) throw new BadInput(problems.join('\n'));
	return { fields: fields.data, email: email.data, adminName: values['admin-name'] ?? null };
}

async function main(): Promise<number> {
	let args;
	try {
		args = readArgs(process.argv.slice(2));
	} catch (err) {
		if (!(err instanceof BadInput)) throw err;
		console.error(`society: ${err.message}\n${USAGE}`);
		return 2;
	}
	if (!args) {
		console.log(USAGE);
		return 0;
	}
	try {
		const input = args;
		const started = await sequelize.transaction((transaction) =>
			startSociety(
				{ ...input.fields, founder: { email: input.email, name: input.adminName } },
				{ transaction, startedBy: 'operator' }
			)
		);
		const origin = process.env.ORIGIN ?? 'http://localhost:3000';
		const f = args.fields;
		console.log(`Started ${started.society.name} (short name ${started.society.slug}).`);
		console.log(
			`Settings: country ${f.country}, lengths in ${f.unit} first, ${f.paperSize === 'a4' ? 'A4' : 'Letter'} paper, time zone ${f.timeZone}, currency ${f.currency}.`
		);
		console.log(
			`Society admin: ${started.admin.email} (${started.admin.created ? 'new account' : 'existing account'}).`
		);
		console.log(
			`Scales of points: ${started.scales.map((s) => s.name).join('; ')}. Award rules: the defaults, ready to edit.`
		);
		console.log(
			`How the admin signs in: open ${origin}/signin, enter ${started.admin.email} and follow the link that arrives by e-mail; then invite the others from ${origin}/admin/members?society=${started.society.slug}.`
		);
		return 0;
	} catch (err) {
		if (err instanceof SocietyError) {
			console.error(`society: ${err.message}`);
			return 2;
		}
		console.error(isDatabaseDown(err) ? DATABASE_DOWN_HINT : err);
		return 1;
	}
}

main()
	.then((code) => {
		process.exitCode = code;
	})
	.catch((err: unknown) => {
		console.error(err);
		process.exitCode = 1;
	})
	.finally(() => sequelize.close());
