type Env = Record<string, string | undefined>;

/** True when /dev/mail may show caught mail: development, or a test or demo run that opts in. */
export function devMailEnabled(env: Env = process.env): boolean {
	return !!env.CB_DEV_MAIL_URL && (env.NODE_ENV !== 'production' || env.CB_ALLOW_DEV_MAIL === '1');
}

/**
 * Settings the app refuses to start with in production, as plain sentences (none: it starts).
 * `/dev/mail` shows every sign-in link to anyone, so CB_DEV_MAIL_URL needs CB_ALLOW_DEV_MAIL=1.
 */
export function productionSettingProblems(env: Env = process.env): string[] {
	if (env.NODE_ENV !== 'production') return [];
	const problems: string[] = [];
	if (env.CB_DEV_MAIL_URL && env.CB_ALLOW_DEV_MAIL !== '1') {
		problems.push(
			'CB_DEV_MAIL_URL is set: /dev/mail would show every sign-in link to anyone. Unset it (a test or demo run sets CB_ALLOW_DEV_MAIL=1).'
		);
	}
	if (!env.ORIGIN && !env.AUTH_URL && env.AUTH_TRUST_HOST !== 'true') {
		problems.push(
			'Set ORIGIN (or AUTH_URL) to the public address: sign-in links are made from it.'
		);
	}
	return problems;
}
