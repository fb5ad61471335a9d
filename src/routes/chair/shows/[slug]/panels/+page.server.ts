import {
	panelClassSchema,
	panelClerkSchema,
	panelNameSchema,
	panelPersonSchema
} from '$lib/schemas/judging';
import { z } from 'zod';
import { sequelize } from '$lib/server/db';
import { runFormAction } from '$lib/server/services/form-actions';
import {
	addJudge,
	assignClass,
	createPanel,
	deletePanel,
	loadPanelsPage,
	removeJudge,
	setClerk
} from '$lib/server/services/panels';
import { requireShowRole } from '$lib/server/services/show-access';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { show } = await requireShowRole(event, event.params.slug, ['chair']);
	return {
		show: { name: show.name, slug: show.slug, locked: show.resultsPublishedAt !== null },
		...(await loadPanelsPage(show))
	};
};

/** Every action: chair of the show's society, zod-checked input, one transaction. */
function action<S extends z.ZodType>(
	schema: S,
	work: (
		show: Awaited<ReturnType<typeof requireShowRole>>['show'],
		input: z.infer<S>,
		transaction: import('sequelize').Transaction
	) => Promise<string>
) {
	return async (event: Parameters<Actions[string]>[0]) => {
		const { show } = await requireShowRole(event, event.params.slug as string, ['chair']);
		return runFormAction(await event.request.formData(), schema, (input) =>
			sequelize.transaction((transaction) => work(show, input, transaction))
		);
	};
}

export const actions: Actions = {
	createPanel: action(panelNameSchema, async (show, input, transaction) => {
		await createPanel(show, input.name, { transaction });
		return `${input.name} added.`;
	}),
	deletePanel: action(z.object({ panelId: z.uuid('Choose a panel.') }), async (show, input, t) => {
		await deletePanel(show, input.panelId, { transaction: t });
		return 'Panel removed.';
	}),
	addJudge: action(panelPersonSchema, async (show, input, transaction) => {
		await addJudge(show, input.panelId, input.userId, { transaction });
		return 'Judge added.';
	}),
	removeJudge: action(panelPersonSchema, async (show, input, transaction) => {
		await removeJudge(show, input.panelId, input.userId, { transaction });
		return 'Judge taken off the panel.';
	}),
	setClerk: action(panelClerkSchema, async (show, input, transaction) => {
		await setClerk(show, input.panelId, input.userId || null, { transaction });
		return input.userId ? 'Clerk set.' : 'Clerk removed.';
	}),
	assignClass: action(panelClassSchema, async (show, input, transaction) => {
		await assignClass(show, input.classId, input.panelId || null, { transaction });
		return input.panelId ? 'Class assigned.' : 'Class taken off its panel.';
	})
};
