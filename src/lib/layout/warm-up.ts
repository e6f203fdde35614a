// A small drawing that exercises the layout's code paths (several kinds, side and bottom
// terminals), laid out once when the worker starts so the JIT has seen them.
import { assertDocument, type HarnessDocument } from '../circuit/schema';

export function warmUpDocument(lamps = 12): HarnessDocument {
	const parts: Record<string, unknown>[] = [
		{ id: 'b', key: '1', kind: 'battery' },
		{ id: 'e', key: '2', kind: 'earth-point' }
	];
	const wires: Record<string, unknown>[] = [{ id: 'w0', from: { part: 'b', terminal: '-' }, to: { part: 'e', terminal: 'stud' }, code: 'B' }];
	for (let i = 0; i < lamps; i++) {
		parts.push({ id: `f${i}`, key: `f${i}`, kind: 'fuse' }, { id: `l${i}`, key: `l${i}`, kind: i % 3 ? 'lamp' : 'motor' });
		wires.push(
			{ id: `a${i}`, from: { part: 'b', terminal: '+' }, to: { part: `f${i}`, terminal: 'in' }, code: 'N' },
			{ id: `c${i}`, from: { part: `f${i}`, terminal: 'out' }, to: { part: `l${i}`, terminal: 'feed' }, code: 'G' },
			{ id: `d${i}`, from: { part: `l${i}`, terminal: 'earth' }, to: { part: 'e', terminal: 'stud' }, code: 'B' }
		);
	}
	return assertDocument({ schemaVersion: 1, vehicle: { systemVoltage: 12, earth: 'negative' }, parts, wires });
}
