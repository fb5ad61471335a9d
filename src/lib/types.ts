/** A show as listed on overview pages (shared by server services and pages). */
export interface ShowSummary {
	id: string;
	slug: string;
	name: string;
	societyName: string;
	venue: string | null;
	entriesOpen: string;
	entriesClose: string;
	judgingDay: string;
	schedulePublished: boolean;
	resultsPublished: boolean;
	entryCount: number;
}
