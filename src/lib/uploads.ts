/**
 * Limits of photo uploads (entry photos and plant photos), in one place. One photo per request:
 * a photo may be up to 8 MB and the built server reads at most BODY_SIZE_LIMIT (12 MB) per
 * request, so two would not fit anyway.
 * Shared by the server checks and the forms that name them.
 */
export const PHOTO_LIMITS = {
	maxBytes: 8 * 1024 * 1024,
	perRequest: 1,
	perEntry: 4,
	perPlant: 12
} as const;
