import { expect, type Page } from '@playwright/test';

// The published scale: symmetry 25, condition 25, quantity of bloom 25, size and type of blossom
// 15, color of blossom 10 ("A Beginner's Guide to Judging", AVM 1993, rev. 2020 (DOMAIN.md)).
export const CRITERIA = [
	'Symmetry or leaf pattern',
	'Condition',
	'Quantity of bloom',
	'Size and type of blossom',
	'Color of blossom'
];

export const sum = (xs: number[]) => xs.reduce((a, b) => a + b, 0);

/** Scores the entry on screen: the last criterion by the half-point button, the rest by typing. */
export async function score(page: Page, deduct: number[]): Promise<void> {
	for (let i = 0; i < CRITERIA.length - 1; i++) {
		const input = page.getByLabel(CRITERIA[i], { exact: true });
		await input.fill(String(deduct[i]));
		await input.press('Tab');
	}
	const last = CRITERIA[CRITERIA.length - 1];
	for (let n = 0; n < deduct[CRITERIA.length - 1] * 2; n++) {
		await page.getByRole('button', { name: `Deduct half a point on ${last}` }).click();
	}
	await expect(page.getByTestId('running-total')).toHaveText(String(100 - sum(deduct)));
}

/** Changes one entry takes in `score`: four typed criteria and one click per half point. */
export const changesOf = (s: { deduct: number[] }) => CRITERIA.length - 1 + s.deduct[4] * 2;
