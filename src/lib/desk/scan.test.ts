import { describe, expect, it } from 'vitest';
import { entryNumberFromScan } from './scan';

// The tag's QR code holds the tag address the tags PDF prints (src/lib/server/entries/tags-pdf.ts).
describe('entryNumberFromScan', () => {
	it.each<[string, number | null]>([
		['https://shows.example.org/e/spring-show/417', 417],
		['http://localhost:3000/e/spring-show/1207/', 1207],
		['/e/spring-show/12', 12],
		['  88 ', 88],
		['https://shows.example.org/e/other-show/417', null],
		['https://shows.example.org/desk/spring-show/entries/417', null],
		['https://shows.example.org/e/spring-show/abc', null],
		['not a tag', null],
		['', null],
		['https://shows.example.org/e/%E0%A4%A/5', null]
	])('%s → %s', (scanned, number) => {
		expect(entryNumberFromScan(scanned, 'spring-show')).toBe(number);
	});
});
