import type { Transaction } from 'sequelize';
import {
	STAGE_WORDS,
	checkChange,
	stageOf,
	type ShowChange,
	type ShowStage,
	type StageVerdict
} from '$lib/domain/show-stage';
import { todayIn } from '$lib/domain/dates';
import { Entry, Show, ShowClass } from '../db';
import { loadSocietySettings } from '../people/society-settings';

/** A show's stage as pages show it. */
export interface StageView {
	stage: ShowStage;
	label: string;
	meaning: string;
}

type StageShow = Pick<
	Show,
	| 'id'
	| 'societyId'
	| 'entriesOpen'
	| 'entriesClose'
	| 'entryDay'
	| 'judgingDay'
	| 'schedulePublishedAt'
	| 'resultsPublishedAt'
>;

/** The stage of a show today, in its society's time zone. */
export async function stageOfShow(
	show: StageShow,
	options: { transaction?: Transaction; now?: Date } = {}
): Promise<ShowStage> {
	const { timeZone } = await loadSocietySettings(show.societyId, options);
	const today = todayIn(timeZone, options.now ?? new Date());
	return stageOf(
		{
			entriesOpen: show.entriesOpen,
			entriesClose: show.entriesClose,
			entryDay: show.entryDay,
			judgingDay: show.judgingDay,
			schedulePublished: show.schedulePublishedAt !== null,
			resultsPublished: show.resultsPublishedAt !== null
		},
		today
	);
}

/** The stage of a show with its plain words, for the banner on the show's pages. */
export async function loadStageView(show: StageShow): Promise<StageView> {
	const stage = await stageOfShow(show);
	return { stage, ...STAGE_WORDS[stage] };
}

/** The stage banner of the show with this id (for pages that reach the show through a class). */
export async function loadStageViewOfShow(showId: string): Promise<StageView | null> {
	const show = await Show.findByPk(showId);
	return show ? loadStageView(show) : null;
}

/**
 * May this change happen to the show now? Reads the facts the change needs (its classes for
 * publishing the schedule, its entries for hiding it) in the caller's transaction.
 */
export async function verdictFor(
	show: StageShow,
	change: ShowChange,
	options: { transaction: Transaction }
): Promise<StageVerdict> {
	const { transaction } = options;
	const stage = await stageOfShow(show, { transaction });
	if (change === 'publish_schedule') {
		const classes = await ShowClass.findAll({
			where: { showId: show.id },
			attributes: ['code', 'scaleId'],
			order: [['position', 'ASC']],
			transaction
		});
		return checkChange(stage, change, {
			classes: classes.map((c) => ({ code: c.code, scaleId: c.scaleId }))
		});
	}
	if (change === 'hide_schedule') {
		const entryCount = await Entry.count({ where: { showId: show.id }, transaction });
		return checkChange(stage, change, { entryCount });
	}
	return checkChange(stage, change);
}
