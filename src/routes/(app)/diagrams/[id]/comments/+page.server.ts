import { fail } from '@sveltejs/kit';
import { canComment, requireDiagram } from '$lib/server/access';
import * as comments from '$lib/server/comments';
import { formObject } from '$lib/server/forms';
import { fieldErrors, fromZod } from '$lib/server/issues';
import type { Actions, PageServerLoad } from './$types';

// The discussion of a diagram: on the whole drawing, or on one part or wire; threaded.

/** "part:<id>", "wire:<id>" or "diagram", as the target picker and ?about= write it. */
function about(value: string): { target: string; id: string } {
	const [target, ...rest] = value.split(':');
	return { target, id: rest.join(':') };
}

export const load: PageServerLoad = async ({ locals, params, url }) => {
	const { diagram } = await requireDiagram(locals, params.id, 'comment');
	const targets = comments.targetsOf(diagram.document);
	// ?about=part:<id> or wire:<id> (from the drawing board): open at that part's or wire's comments.
	const { target: kind, id } = about(url.searchParams.get('about') ?? '');
	const known = kind === 'part' ? targets.parts : kind === 'wire' ? targets.wires : [];
	const hit = known.find((t) => t.id === id);
	return {
		diagram: { id: diagram.id, title: diagram.title },
		comments: await comments.list(diagram.id),
		targets,
		focus: hit ? { key: `${kind}:${id}`, target: kind as 'part' | 'wire', id, name: `${kind === 'part' ? 'Part' : 'Wire'} ${hit.label}` } : null,
		canComment: canComment(locals.user, diagram)
	};
};

export const actions: Actions = {
	default: async ({ locals, params, request }) => {
		const { diagram } = await requireDiagram(locals, params.id, 'comment');
		const values = formObject(await request.formData());
		const { target, id } = about(values.about ?? 'diagram');
		const parsed = comments.commentBody.safeParse({
			body: values.body,
			parentId: values.parentId || undefined,
			target,
			targetId: id || undefined
		});
		if (!parsed.success) return fail(400, { values, errors: fieldErrors(fromZod(parsed.error)) });
		const r = await comments.add(diagram, locals.user!, parsed.data);
		if (!r.ok) return fail(400, { values, errors: { [r.field]: r.message } as Record<string, string> });
		return { posted: r.comment.id };
	}
};
