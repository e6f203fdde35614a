import { error } from '@sveltejs/kit';
import { NOT_FOUND, requireAdmin } from '$lib/server/access';
import { config } from '$lib/server/config';
import { readMessage } from '$lib/server/mail-read';
import type { PageServerLoad } from './$types';

type Caught = { id: number; from: string; to: string[]; raw: string; receivedAt: string };

// Development only (config.devMail): the mail the local SMTP catcher has caught, newest first.
// Site admins only; to anyone else, and in production, the page does not exist.
export const load: PageServerLoad = async ({ locals, fetch }) => {
	requireAdmin(locals);
	if (!config.devMail) error(404, NOT_FOUND);
	let caught: Caught[] = [];
	let problem: string | null = null;
	try {
		const res = await fetch(config.caughtMailUrl);
		if (!res.ok) throw new Error(`answered ${res.status}`);
		caught = (await res.json()) as Caught[];
	} catch (e) {
		problem = `The mail catcher at ${config.caughtMailUrl} did not answer (${e instanceof Error ? e.message : e}). Is scripts/fakes.ts running?`;
	}
	return {
		problem,
		total: caught.length,
		// The newest hundred is plenty to find a message; the catcher keeps up to 500.
		messages: caught
			.slice(-100)
			.reverse()
			.map((m) => ({ id: m.id, envelopeTo: m.to, receivedAt: m.receivedAt, ...readMessage(m.raw) }))
	};
};
