import { listPublicShows } from '$lib/server/shows/shows';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => ({ shows: await listPublicShows() });
