/**
 * Names of what a judge's tablet keeps, shared by the judging pages and the service worker.
 * Everything is kept per person (their user id): a second person on the same tablet opens other
 * caches and another database, and so never sees the first person's pages, sheets or changes.
 */

/** The header by which judging pages say whose they are (set by the judging layout's load). */
export const PERSON_HEADER = 'x-crownbench-person';

/** Cache Storage: the judging pages kept for one person. */
export const PAGES_CACHE_PREFIX = 'crownbench-judging-pages-';
export const pagesCacheOf = (person: string): string => `${PAGES_CACHE_PREFIX}${person}`;

/** Cache Storage: the person whose pages are served offline (one entry, PERSON_KEY). */
export const PERSON_CACHE = 'crownbench-person';
export const PERSON_KEY = '/__crownbench/person';

/** IndexedDB: one database per person, one store, these keys (idb-keyval). */
export const tabletDbOf = (person: string): string => `crownbench-tablet-${person}`;
export const TABLET_STORE = 'kept';
export const TABLET_KEYS = {
	/** Sheet changes not yet acknowledged by the server, oldest first. */
	changes: 'changes',
	/** Changes the server refused for good, kept but never sent again. */
	setAside: 'set-aside',
	/** Each sheet as the server last kept it, by entry id. */
	sheets: 'sheets',
	/** When the last change reached the server (milliseconds since 1970). */
	lastReached: 'last-reached'
} as const;

/** The database the tablet used before changes were kept per person (read once, then emptied). */
export const LEGACY_DB = 'crownbench-judging';
export const LEGACY_STORE = 'queue';
