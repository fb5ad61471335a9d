import { requireShowRole } from '$lib/server/shows/policies';
import { loadPaperClasses, loadPaperPanels } from '$lib/server/judging/paper-sheets';
import type { PageServerLoad } from './$types';

/** The paper fallback: judging sheets per class, class lists per panel, typing a sheet in. */
export const load: PageServerLoad = async (event) => {
	const { show, user } = await requireShowRole(event, event.params.slug, ['clerk', 'chair']);
	const [classes, panels] = await Promise.all([
		loadPaperClasses(show.id),
		loadPaperPanels(show.id)
	]);
	const clerkOf = new Set(
		panels.filter((p) => p.clerkId === user.id).flatMap((p) => p.classes.map((c) => c.id))
	);
	return {
		show: { name: show.name, slug: show.slug },
		classes: classes.map((c) => ({
			id: c.id,
			label: `${c.code} ${c.name}`,
			panel: c.panel,
			entries: c.entries.length,
			canType: clerkOf.has(c.id)
		})),
		panels: panels.map((p) => ({ id: p.id, name: p.name, classes: p.classes.length }))
	};
};
