const ENTITIES: Record<string, string> = {
	'&': '&amp;',
	'<': '&lt;',
	'>': '&gt;',
	'"': '&quot;',
	"'": '&#39;'
};

/** Escapes text for safe use inside HTML mail. */
export function escapeHtml(value: string): string {
	return value.replace(/[&<>"']/g, (c) => ENTITIES[c]);
}
