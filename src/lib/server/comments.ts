// Comments on a diagram, or on one of its parts or wires (named by its id in the document),
// threaded by replying to a comment. The owner hears of each new comment by e-mail unless they
// turned it off (account page) or wrote it themselves.
import { and, asc, count, eq, ne } from 'drizzle-orm';
import type { User as SessionUser } from 'lucia';
import { z } from 'zod';
import { db } from './db';
import { comments, users, type Diagram } from './db/schema';
import * as mail from './mail';

export const commentBody = z.object({
	body: z.string({ error: 'Write a comment.' }).trim().min(1, 'Write a comment.').max(4000, 'A comment can be at most 4000 characters.'),
	parentId: z.uuid('Reply to a comment of this diagram.').optional(),
	target: z.enum(['diagram', 'part', 'wire'], { error: 'Comment on the diagram, a part or a wire.' }).default('diagram'),
	targetId: z.string().trim().max(200).optional()
});
export type CommentInput = z.infer<typeof commentBody>;

export interface CommentJson {
	id: string;
	parentId: string | null;
	target: 'diagram' | 'part' | 'wire';
	targetId: string | null;
	author: string;
	body: string;
	createdAt: string;
}

export async function list(diagramId: string): Promise<CommentJson[]> {
	const rows = await db
		.select({ c: comments, author: users.displayName })
		.from(comments)
		.leftJoin(users, eq(users.id, comments.authorId))
		.where(eq(comments.diagramId, diagramId))
		.orderBy(asc(comments.createdAt));
	return rows.map(({ c, author }) => ({
		id: c.id,
		parentId: c.parentId,
		target: c.target,
		targetId: c.targetId,
		author: author ?? 'a deleted account',
		body: c.body,
		createdAt: c.createdAt.toISOString()
	}));
}

/** How many comments (replies included) each part and wire has, keyed "part:<id>" / "wire:<id>". */
export async function countsByTarget(diagramId: string): Promise<Record<string, number>> {
	const rows = await db
		.select({ target: comments.target, targetId: comments.targetId, n: count() })
		.from(comments)
		.where(and(eq(comments.diagramId, diagramId), ne(comments.target, 'diagram')))
		.groupBy(comments.target, comments.targetId);
	return Object.fromEntries(rows.map((r) => [`${r.target}:${r.targetId}`, r.n]));
}

/** Parts and wires of a document as {id, label}, to comment on one of them. */
export function targetsOf(document: unknown): { parts: { id: string; label: string }[]; wires: { id: string; label: string }[] } {
	const doc = (document ?? {}) as { parts?: unknown; wires?: unknown };
	const list = (x: unknown) => (Array.isArray(x) ? (x as Record<string, unknown>[]) : []);
	const str = (x: unknown) => (typeof x === 'string' ? x : '');
	const parts = list(doc.parts).flatMap((p) =>
		typeof p?.id === 'string' ? [{ id: p.id, label: [str(p.key), str(p.label)].filter(Boolean).join(' ') || p.id }] : []
	);
	// A wire as the restorer reads it off the harness: its code and the terminals it joins, by the
	// parts' key numbers and names (the drawing's own ids mean nothing on the bench).
	const partLabel = new Map(parts.map((p) => [p.id, p.label]));
	const end = (x: unknown) => {
		const ref = (x ?? {}) as { part?: unknown; terminal?: unknown };
		const part = partLabel.get(str(ref.part)) ?? 'a part not in the drawing';
		return str(ref.terminal) ? `${part}, terminal ${str(ref.terminal)}` : part;
	};
	const wires = list(doc.wires).flatMap((w) =>
		typeof w?.id === 'string' ? [{ id: w.id, label: `${str(w.code) || 'with no code'} from ${end(w.from)} to ${end(w.to)}` }] : []
	);
	return { parts, wires };
}

export type AddResult = { ok: true; comment: CommentJson } | { ok: false; field: string; message: string };

export async function add(diagram: Diagram, author: Pick<SessionUser, 'id' | 'displayName'>, input: CommentInput): Promise<AddResult> {
	let target = input.target;
	let targetId = target === 'diagram' ? null : (input.targetId ?? null);
	if (input.parentId) {
		const [parent] = await db.select().from(comments).where(and(eq(comments.id, input.parentId), eq(comments.diagramId, diagram.id)));
		if (!parent) return { ok: false, field: 'parentId', message: 'The comment you reply to is not on this diagram.' };
		// A reply belongs to its thread's part or wire.
		target = parent.target;
		targetId = parent.targetId;
	} else if (target !== 'diagram') {
		const known = targetsOf(diagram.document)[target === 'part' ? 'parts' : 'wires'];
		if (!targetId || !known.some((t) => t.id === targetId)) {
			return { ok: false, field: 'targetId', message: `Choose a ${target} of this diagram (no ${target} has the id “${targetId ?? ''}”).` };
		}
	}
	const [row] = await db
		.insert(comments)
		.values({ diagramId: diagram.id, authorId: author.id, parentId: input.parentId ?? null, target, targetId, body: input.body })
		.returning();
	if (diagram.ownerId !== author.id) {
		const [owner] = await db.select().from(users).where(eq(users.id, diagram.ownerId));
		if (owner?.notifyComments) {
			const labels = targetsOf(diagram.document);
			const where =
				target === 'diagram'
					? 'the whole diagram'
					: `the ${target} ${(target === 'part' ? labels.parts : labels.wires).find((t) => t.id === targetId)?.label ?? targetId}`;
			const excerpt = input.body.length > 400 ? input.body.slice(0, 400) + '…' : input.body;
			await mail.newComment(owner.email, author.displayName, diagram.title, where, excerpt, mail.link(`/diagrams/${diagram.id}/comments`));
		}
	}
	return {
		ok: true,
		comment: { id: row.id, parentId: row.parentId, target: row.target, targetId: row.targetId, author: author.displayName, body: row.body, createdAt: row.createdAt.toISOString() }
	};
}
