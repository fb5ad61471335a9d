import {
	panelClassSchema,
	panelClerkSchema,
	panelNameSchema,
	panelPersonSchema
} from '$lib/schemas/judging';
import { z } from 'zod';
import type { Transaction } from 'sequelize';
import { sequelize } from '$lib/server/db';
import { requireConfirmation } from '$lib/server/http/confirm';
import { runFormAction } from '$lib/server/http/form-actions';
import {
	addJudge,
	assignClass,
	clerkOfPanel,
	createPanel,
	deletePanel,
	loadPanelsPage,
	panelOfClass,
	removeJudge,
	setClerk
} from '$lib/server/judging/panels';
import { requireShowRole } from '$lib/server/shows/policies';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['chair']);
	return {
		show: { name: show.name, slug: show.slug, locked: show.resultsPublishedAt !== null },
		...(await loadPanelsPage(show))
	};
};

type ShowOf = Awaited<ReturnType<typeof requireShowRole>>['show'];

/**
 * Every action: chair of the show's society, zod-checked input, one transaction. `ask` names the
 * question when the change takes someone or something away: then the form must carry confirm=yes.
 */
function action<S extends z.ZodType>(
	schema: S,
	work: (
		show: ShowOf,
		input: z.infer<S>,
		transaction: Transaction,
		actor: App.SignedInUser
	) => Promise<string>,
	ask?: (show: ShowOf, input: z.infer<S>) => Promise<string | null>
) {
	return async (event: Parameters<Actions[string]>[0]) => {
		const { show, user } = await requireShowRole(event, event.params.slug as string, ['chair']);
		const form = await event.request.formData();
		const parsed = schema.safeParse(Object.fromEntries(form));
		const question = parsed.success && ask ? await ask(show, parsed.data) : null;
		const unconfirmed = question ? requireConfirmation(event, form, question) : null;
		if (unconfirmed) return unconfirmed;
		return runFormAction(form, schema, (input) =>
			sequelize.transaction((transaction) => work(show, input, transaction, user))
		);
	};
}

export const actions: Actions = {
	createPanel: action(panelNameSchema, async (show, input, transaction) => {
		await createPanel(show, input.name, { transaction });
		return `${input.name} added.`;
	}),
	deletePanel: action(
		z.object({ panelId: z.uuid('Choose a panel.') }),
		async (show, input, transaction, actor) => {
			await deletePanel(show, input.panelId, { transaction, actor });
			return 'Panel removed.';
		},
		async () => 'Remove this panel? Its classes will have no panel.'
	),
	addJudge: action(panelPersonSchema, async (show, input, transaction) => {
		await addJudge(show, input.panelId, input.userId, { transaction });
		return 'Judge added.';
	}),
	removeJudge: action(
		panelPersonSchema,
		async (show, input, transaction, actor) => {
			await removeJudge(show, input.panelId, input.userId, { transaction, actor });
			return 'Judge taken off the panel.';
		},
		async () => 'Take this judge off the panel?'
	),
	setClerk: action(
		panelClerkSchema,
		async (show, input, transaction, actor) => {
			await setClerk(show, input.panelId, input.userId || null, { transaction, actor });
			return input.userId ? 'Clerk set.' : 'Clerk removed.';
		},
		async (show, input) => {
			const clerkId = await clerkOfPanel(show.id, input.panelId);
			return clerkId && clerkId !== (input.userId || null)
				? 'Replace or remove the clerk of this panel?'
				: null;
		}
	),
	assignClass: action(
		panelClassSchema,
		async (show, input, transaction, actor) => {
			await assignClass(show, input.classId, input.panelId || null, { transaction, actor });
			return input.panelId ? 'Class assigned.' : 'Class taken off its panel.';
		},
		async (show, input) => {
			const panelId = await panelOfClass(show.id, input.classId);
			return panelId && panelId !== (input.panelId || null)
				? 'Take this class off its panel?'
				: null;
		}
	)
};
