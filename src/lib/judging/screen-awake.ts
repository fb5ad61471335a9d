/**
 * Keeps the tablet's screen on while a judging page is open (the Screen Wake Lock API, where the
 * browser has it). The browser lets the lock go whenever the page is hidden, so it is asked for
 * again each time the page comes back. Returns a function that lets it go.
 */
export type ScreenAwake = 'on' | 'off' | 'unavailable';

export function keepScreenAwake(onChange: (state: ScreenAwake) => void): () => void {
	if (!('wakeLock' in navigator)) {
		onChange('unavailable');
		return () => {};
	}
	let lock: WakeLockSentinel | null = null;
	let stopped = false;
	const ask = async () => {
		if (stopped || document.visibilityState !== 'visible' || (lock && !lock.released)) return;
		try {
			lock = await navigator.wakeLock.request('screen');
			lock.addEventListener('release', () => {
				if (!stopped) onChange('off');
			});
			onChange('on');
		} catch {
			// Refused (battery saver, or the page is not visible): the screen sleeps as usual.
			onChange('off');
		}
	};
	const onVisible = () => void ask();
	document.addEventListener('visibilitychange', onVisible);
	void ask();
	return () => {
		stopped = true;
		document.removeEventListener('visibilitychange', onVisible);
		void lock?.release();
	};
}
