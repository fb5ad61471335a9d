import AxeBuilder from '@axe-core/playwright';
import { expect, type Page } from '@playwright/test';

/** Fails when axe-core finds WCAG 2.x A/AA problems on the page as it stands. */
export async function expectAccessible(page: Page): Promise<void> {
	const results = await new AxeBuilder({ page })
		.withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'])
		.analyze();
	const summary = results.violations.map((v) => `${v.id}: ${v.help} (${v.nodes.length})`);
	expect(summary).toEqual([]);
}
