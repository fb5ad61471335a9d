import { error, fail } from '@sveltejs/kit';
import { requireShowRole } from '$lib/server/shows/policies';
import { isUuid, loadJudgeClass } from '$lib/server/judging/judging';
import { isRefusal } from '$lib/server/http/refusal';
import { typePaperSheets } from '$lib/server/judging/paper-sheets';
import type { Actions, PageServerLoad } from './$types';

const ROLES = ['clerk', 'chair'] as const;

/** The class as the panel's clerk opens it: the same reader as the tablet's, with its versions. */
async function panelClass(event: Parameters<PageServerLoad>[0] | Parameters<Actions[string]>[0]) {
	const { show, user } = await requireShowRole(event, event.params.slug!, ROLES);
	const classId = event.params.classId ?? '';
	if (!isUuid(classId)) error(404, 'There is no such class in this show.');
	try {
		const cls = await loadJudgeClass(user.id, classId);
		if (cls.show.id !== show.id) error(404, 'There is no such class in this show.');
		return { show, user, cls };
	} catch (e) {
		if (isRefusal(e)) error(e.status === 404 ? 404 : 403, e.message);
		throw e;
	}
}

export const load: PageServerLoad = async (event) => {
	const { show, cls } = await panelClass(event);
	return {
		show: { name: show.name, slug: show.slug },
		cls: cls.cls,
		panel: cls.panel.name,
		locked: cls.show.locked,
		sheetKind: cls.sheetKind,
		role: cls.role,
		criteria: cls.scale.criteria,
		entries: cls.entries.map((e) => ({ ...e, sheet: cls.sheets[e.id] }))
	};
};

export const actions: Actions = {
	/** Saves the typed paper sheet as the panel's sheets, one entry at a time, with version checks. */
	type: async (event) => {
		const { user, cls } = await panelClass(event);
		const form = await event.request.formData();
		const outcome = await typePaperSheets(user, cls, form);
		if (outcome.problems.length) {
			return fail(400, { message: outcome.problems.join(' '), saved: outcome.saved });
		}
		return {
			saved: outcome.saved,
			done: `Saved ${outcome.saved} sheets of class ${cls.cls.code}.`
		};
	}
};
