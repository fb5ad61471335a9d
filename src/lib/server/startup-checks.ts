import { config, configSchema, productionProblems } from './config';

type Env = Record<string, string | undefined>;

/** True when /dev/mail may show caught mail: development, or a test or demo run that opts in. */
export function devMailEnabled(env?: Env): boolean {
	const c = env ? configSchema.parse(env) : config().raw;
	return !!c.CB_DEV_MAIL_URL && (c.NODE_ENV !== 'production' || c.CB_ALLOW_DEV_MAIL === '1');
}

/**
 * Settings the app refuses to start with in production, as plain sentences (none: it starts);
 * readConfig applies the same at start (see config.ts).
 */
export function productionSettingProblems(env: Env = process.env): string[] {
	return productionProblems(configSchema.parse(env));
}
