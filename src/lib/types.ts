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

/** A variety of a registry as the browser gets it (search API, forms). */
export interface VarietyRow {
	id: string;
	name: string;
	hybridizer: string | null;
	habit: 'single_crown' | 'trailer';
	sizeClass: 'miniature' | 'semiminiature' | 'standard' | 'large';
	blossomType: string;
	blossomColours: string[];
	foliage: 'plain' | 'variegated';
	isSpecies: boolean;
	description: string | null;
	/** African violet, or a gesneriad genus key (domain/plant-groups). */
	plantGroup: string;
	growthForm: string;
	botanicalName: string | null;
}
