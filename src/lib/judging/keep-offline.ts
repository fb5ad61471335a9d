/**
 * Asks the service worker to keep a person's judging pages on the tablet, and answers how many
 * it holds once it has them (null without a service worker, e.g. a browser that has none).
 */
export async function keepPagesOffline(person: string, urls: string[]): Promise<number | null> {
	if (!('serviceWorker' in navigator)) return null;
	const registration = await navigator.serviceWorker.ready;
	const worker = registration.active;
	if (!worker) return null;
	return new Promise((resolve) => {
		const channel = new MessageChannel();
		channel.port1.onmessage = (event: MessageEvent<{ kept: number }>) => resolve(event.data.kept);
		worker.postMessage({ type: 'keep', person, urls }, [channel.port2]);
	});
}
