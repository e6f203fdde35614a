import { inject } from 'vitest';

/** The built app server's origin, started by global-setup.ts. */
export function baseUrl(): string {
	return inject('baseUrl');
}
