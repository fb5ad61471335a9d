/**
 * The entry number in what a camera read off a tag: the tag's QR code holds the address
 * `<origin>/e/<show>/<number>`; a plain number (a typed or printed one) is taken as it is.
 * Null when it is neither, or names another show.
 */
export function entryNumberFromScan(scanned: string, showSlug: string): number | null {
	const text = scanned.trim();
	if (/^\d{1,9}$/.test(text)) return Number(text);
	let path: string;
	try {
		path = new URL(text, 'http://tag.invalid').pathname;
	} catch {
		return null;
	}
	const match = /^\/e\/([^/]+)\/(\d{1,9})\/?$/.exec(path);
	if (!match) return null;
	let slug: string;
	try {
		slug = decodeURIComponent(match[1]);
	} catch {
		return null;
	}
	return slug === showSlug ? Number(match[2]) : null;
}
