/** Thrown by a check when the state can never come (a process ended, say): waitFor stops at once. */
export class GiveUp extends Error {}

/**
 * Waits for a state, never for a time: polls `check` until it returns a value other than
 * undefined/false and returns it; other errors thrown by `check` mean "not yet". The limit only turns a state that never comes into a clear
 * failure; a slow machine just polls longer.
 */
export async function waitFor<T>(
	what: string,
	check: () => Promise<T | undefined | false> | T | undefined | false,
	options: { timeoutMs?: number; everyMs?: number } = {}
): Promise<T> {
	const timeoutMs = options.timeoutMs ?? 90_000;
	const everyMs = options.everyMs ?? 50;
	const until = Date.now() + timeoutMs;
	let lastError: unknown;
	for (;;) {
		try {
			const value = await check();
			if (value !== undefined && value !== false) return value;
		} catch (error) {
			if (error instanceof GiveUp) throw error;
			lastError = error;
		}
		if (Date.now() > until) {
			const reason = lastError instanceof Error ? ` (last error: ${lastError.message})` : '';
			throw new Error(`gave up waiting for ${what} after ${timeoutMs} ms${reason}`);
		}
		await pause(everyMs);
	}
}

/** A short pause between polls or retries (not a wait for something to happen). */
export function pause(ms: number): Promise<void> {
	return new Promise((resolve) => setTimeout(resolve, ms));
}
