/**
 * For tests: the reading that walks a plan toward suspects no probe tells apart — at the plan's
 * first step (or the step of a given probe), the middle of a range that ends on such a group or
 * leads to a step that does (the plan is a tree, plan.ts `checklist`). Null when there is none.
 */
import type { ChecklistStep } from '../../circuit/plan';

export function towardGroup(steps: readonly ChecklistStep[], probe?: string): { probe: string; reading: number } | null {
	const reaches = (n: number): boolean => steps[n - 1].outcomes.some((o) => o.then.kind === 'ambiguous' || (o.then.kind === 'step' && reaches(o.then.step)));
	const at = probe === undefined ? steps[0] : steps.find((s) => s.probe === probe);
	if (!at) return null;
	const o = at.outcomes.find((x) => x.then.kind === 'ambiguous') ?? at.outcomes.find((x) => x.then.kind === 'step' && reaches(x.then.step));
	if (!o) return null;
	const low = Number.isFinite(o.accepts.low) ? o.accepts.low : o.accepts.high;
	const high = Number.isFinite(o.accepts.high) ? o.accepts.high : o.accepts.low;
	// Two decimals, as a 3½-digit meter shows volts; the middle of the range sits inside it.
	return { probe: at.probe, reading: Math.round(((low + high) / 2) * 100) / 100 };
}
