// See https://svelte.dev/docs/kit/types#app.d.ts
declare global {
	namespace App {
		interface Locals {
			user: import('lucia').User | null;
			session: import('lucia').Session | null;
			/** A read-only link token sent with an API request (?link= or x-loomwright-link). */
			linkToken?: string | null;
			/** Set when an error on this request came from the database being away (answered 503). */
			databaseDown?: boolean;
			/** The reader's locale and time zone for writing dates (dates.ts). */
			dates: import('$lib/dates').Dates;
		}
		interface PageData {
			dates: import('$lib/dates').Dates;
		}
		interface Error {
			message: string;
		}
	}
}

export {};
