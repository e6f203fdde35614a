import { fail, redirect } from '@sveltejs/kit';
import { requireLink, requireUser } from '$lib/server/access';
import * as diagrams from '$lib/server/garage/diagrams';
import * as shares from '$lib/server/shares';
import type { Actions, PageServerLoad } from './$types';

// A read-only link: anyone holding it may look at the diagram, never change it. A revoked or
// expired link is 404. Someone signed in may copy it into their own garage.
export const load: PageServerLoad = async ({ params, locals }) => {
	const { diagram, vehicle } = await requireLink(params.token);
	const doc = diagram.document as { parts?: { id: string; key: string; label?: string; kind: string }[]; wires?: { id: string; code: string; from: { part: string; terminal: string }; to: { part: string; terminal: string } }[] };
	const keyOf = new Map((doc.parts ?? []).map((p) => [p.id, p.key]));
	return {
		diagram: diagrams.toJson(diagram),
		vehicle: { name: vehicle.name, make: vehicle.make, model: vehicle.model, year: vehicle.year, systemVoltage: vehicle.systemVoltage, earthPolarity: vehicle.earthPolarity },
		basedOn: shares.basedOn(diagram),
		parts: (doc.parts ?? []).map((p) => ({ id: p.id, key: p.key, label: p.label ?? '', kind: p.kind })),
		wires: (doc.wires ?? []).map((w) => ({
			id: w.id,
			code: w.code,
			from: `${keyOf.get(w.from.part) ?? w.from.part} · ${w.from.terminal}`,
			to: `${keyOf.get(w.to.part) ?? w.to.part} · ${w.to.terminal}`
		})),
		signedIn: locals.user !== null
	};
};

export const actions: Actions = {
	copy: async ({ params, locals }) => {
		const user = requireUser(locals);
		const { diagram, vehicle } = await requireLink(params.token);
		const r = await shares.copyToGarage(diagram, vehicle, user, { newVehicleName: vehicle.name }, diagram.title);
		if (!r.ok) return fail(400, { message: r.message });
		redirect(303, `/diagrams/${r.diagram.id}`);
	}
};
