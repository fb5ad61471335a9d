import { expect, test, type Page } from '@playwright/test';
import { expectAccessible } from './support/axe';
import { createJudgingShow, withDb } from './support/judging-fixture';
import { signIn } from './support/session';

/**
 * Destructive actions ask first (cancel and Escape change nothing, the dialog's own button does
 * it), the server refuses them without `confirm=yes`, and each one appears in the audit log of
 * the show's chair and of the society admin.
 */

async function panelCount(showId: string): Promise<number> {
	return withDb(
		async (db) =>
			(await db.query('SELECT count(*)::int AS n FROM panels WHERE show_id = $1', [showId])).rows[0]
				.n as number
	);
}

async function auditCount(showId: string): Promise<number> {
	return withDb(
		async (db) =>
			(await db.query('SELECT count(*)::int AS n FROM audit_events WHERE show_id = $1', [showId]))
				.rows[0].n as number
	);
}

async function openRemoveDialog(page: Page) {
	await page.getByRole('button', { name: 'Remove Bench One' }).click();
	const dialog = page.getByRole('dialog', { name: 'Remove Bench One?' });
	await expect(dialog).toBeVisible();
	return dialog;
}

test('removing a panel asks first; cancel keeps it, confirm removes it, and the log shows it', async ({
	page,
	browser
}) => {
	const show = await createJudgingShow(2);
	await signIn(page, 'chair@crownbench.test');
	await page.goto(`/chair/shows/${show.slug}/panels`);

	// The dialog opens with the safe choice focused; Escape closes it and nothing changes.
	let dialog = await openRemoveDialog(page);
	await expect(dialog.getByRole('button', { name: 'Cancel' })).toBeFocused();
	await expectAccessible(page);
	await page.keyboard.press('Escape');
	await expect(dialog).toBeHidden();
	// Cancel likewise.
	dialog = await openRemoveDialog(page);
	await dialog.getByRole('button', { name: 'Cancel' }).click();
	await expect(dialog).toBeHidden();
	expect(await panelCount(show.showId)).toBe(1);
	expect(await auditCount(show.showId)).toBe(0);

	dialog = await openRemoveDialog(page);
	await dialog.getByRole('button', { name: 'Yes, remove the panel' }).click();
	await expect(page.getByText('Panel removed.')).toBeVisible();
	await expect(page.getByRole('heading', { name: 'Bench One' })).toHaveCount(0);
	expect(await panelCount(show.showId)).toBe(0);
	expect(await auditCount(show.showId)).toBe(1);

	// The chair's log of the show.
	await page.goto(`/chair/shows/${show.slug}/audit`);
	const row = page.getByRole('row').filter({ hasText: 'Panel removed' });
	await expect(row).toContainText('Bench One');
	await expect(row).toContainText('chair@crownbench.test');
	await expectAccessible(page);

	// The society admin's log, filtered by what happened, on a laptop and on a phone.
	const adminContext = await browser.newContext();
	const admin = await adminContext.newPage();
	await signIn(admin, 'admin@crownbench.test');
	await admin.goto('/admin');
	await admin.getByRole('link', { name: 'Read the audit log' }).click();
	await expect(admin.getByRole('heading', { level: 1, name: 'Audit log' })).toBeVisible();
	await admin.getByLabel('What happened').selectOption({ label: 'Panel removed' });
	await admin.getByRole('button', { name: 'Show', exact: true }).click();
	await expect(admin).toHaveURL(/action=panel\.delete/);
	const showName = `Judging test show ${show.slug.replace('judging-test-', '')}`;
	await expect(
		admin.getByRole('row').filter({ hasText: 'Bench One' }).filter({ hasText: showName })
	).toHaveCount(1);
	await expect(admin.getByRole('row').filter({ hasText: 'Score sheet changed' })).toHaveCount(0);
	await expectAccessible(admin);
	await admin.setViewportSize({ width: 375, height: 740 });
	await expect(
		admin.getByRole('list', { name: 'Audit log' }).getByText('Panel removed: Bench One').first()
	).toBeVisible();
	await expect(admin.getByRole('table')).toBeHidden();
	await expectAccessible(admin);
	await adminContext.close();
});

test('the server refuses a removal without confirmation; without JavaScript the page asks, then does it', async ({
	page,
	browser
}) => {
	const show = await createJudgingShow(2);
	const panelId = await withDb(
		async (db) =>
			(await db.query('SELECT id FROM panels WHERE show_id = $1', [show.showId])).rows[0]
				.id as string
	);
	await signIn(page, 'chair@crownbench.test');
	const origin = new URL(page.url()).origin;
	const refused = await page.request.post(`/chair/shows/${show.slug}/panels?/deletePanel`, {
		form: { panelId },
		headers: { origin, accept: 'application/json' }
	});
	const answer = (await refused.json()) as { type: string; status: number; data: string };
	expect(answer.type).toBe('failure');
	expect(answer.status).toBe(400);
	expect(answer.data).toContain('confirm to go ahead');
	// A confirm that is not exactly "yes" is no confirmation.
	const twice = await page.request.post(`/chair/shows/${show.slug}/panels?/deletePanel`, {
		form: { panelId, confirm: 'true' },
		headers: { origin, accept: 'application/json' }
	});
	expect(((await twice.json()) as { status: number }).status).toBe(400);
	expect(await panelCount(show.showId)).toBe(1);
	expect(await auditCount(show.showId)).toBe(0);

	// A plain (not enhanced) post gets the page with the question and a second button.
	const question = 'Remove this panel? Its classes will have no panel.';
	await page.goto(`/chair/shows/${show.slug}/panels`);
	await page.evaluate((id) => {
		const form = Object.assign(document.createElement('form'), {
			method: 'POST',
			action: '?/deletePanel'
		});
		form.append(Object.assign(document.createElement('input'), { name: 'panelId', value: id }));
		document.body.append(form);
		form.submit();
	}, panelId);
	await expect(page.getByRole('heading', { name: question })).toBeVisible();
	await expectAccessible(page);
	expect(await panelCount(show.showId)).toBe(1);

	// Without JavaScript: the form goes unconfirmed, the answer asks, the second button does it.
	const context = await browser.newContext({ javaScriptEnabled: false });
	await context.addCookies(await page.context().cookies());
	const plain = await context.newPage();
	await plain.goto(`/chair/shows/${show.slug}/panels`);
	await plain.getByRole('button', { name: 'Remove Bench One' }).click();
	await expect(plain.getByRole('heading', { name: question })).toBeVisible();
	expect(await panelCount(show.showId)).toBe(1);
	await plain.getByRole('button', { name: 'Yes, go ahead' }).click();
	await expect(plain.getByText('Panel removed.')).toBeVisible();
	expect(await panelCount(show.showId)).toBe(0);
	expect(await auditCount(show.showId)).toBe(1);
	await context.close();
});
