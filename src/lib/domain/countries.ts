/**
 * Countries a society can name as its home: ISO 3166-1 alpha-2 codes with their English short
 * names. A choice of the countries where plant societies commonly meet, not every country.
 */
export const COUNTRIES: readonly { code: string; name: string }[] = [
	{ code: 'AR', name: 'Argentina' },
	{ code: 'AU', name: 'Australia' },
	{ code: 'AT', name: 'Austria' },
	{ code: 'BE', name: 'Belgium' },
	{ code: 'BR', name: 'Brazil' },
	{ code: 'CA', name: 'Canada' },
	{ code: 'CZ', name: 'Czechia' },
	{ code: 'DK', name: 'Denmark' },
	{ code: 'FI', name: 'Finland' },
	{ code: 'FR', name: 'France' },
	{ code: 'DE', name: 'Germany' },
	{ code: 'HU', name: 'Hungary' },
	{ code: 'IN', name: 'India' },
	{ code: 'IE', name: 'Ireland' },
	{ code: 'IL', name: 'Israel' },
	{ code: 'IT', name: 'Italy' },
	{ code: 'JP', name: 'Japan' },
	{ code: 'LV', name: 'Latvia' },
	{ code: 'LT', name: 'Lithuania' },
	{ code: 'MX', name: 'Mexico' },
	{ code: 'NL', name: 'Netherlands' },
	{ code: 'NZ', name: 'New Zealand' },
	{ code: 'NO', name: 'Norway' },
	{ code: 'PL', name: 'Poland' },
	{ code: 'PT', name: 'Portugal' },
	{ code: 'SG', name: 'Singapore' },
	{ code: 'ZA', name: 'South Africa' },
	{ code: 'KR', name: 'South Korea' },
	{ code: 'ES', name: 'Spain' },
	{ code: 'SE', name: 'Sweden' },
	{ code: 'CH', name: 'Switzerland' },
	{ code: 'TW', name: 'Taiwan' },
	{ code: 'UA', name: 'Ukraine' },
	{ code: 'GB', name: 'United Kingdom' },
	{ code: 'US', name: 'United States' }
];

const CODES = new Set(COUNTRIES.map((c) => c.code));

/** True for a country code in the list a society chooses from. */
export function isKnownCountry(value: unknown): value is string {
	return typeof value === 'string' && CODES.has(value);
}
