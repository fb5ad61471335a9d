import type { Role } from '$lib/roles';

declare global {
	namespace App {
		interface Error {
			message: string;
		}
		interface PageState {
			/** The entry shown on a judge's scoresheet after moving between entries without a reload. */
			entryId?: string;
		}
		interface Locals {
			/** The signed-in person, or null; filled by hooks.server.ts. */
			user: SignedInUser | null;
			/** This request's id in the logs and the X-Request-Id header; set by hooks.server.ts. */
			requestId?: string;
		}
		interface SignedInUser {
			id: string;
			email: string;
			name: string | null;
			memberships: { societyId: string; societySlug: string; societyName: string; roles: Role[] }[];
		}
	}
}

export {};
