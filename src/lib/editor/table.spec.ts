import { describe, expect, it } from 'vitest';
import { compareCells, cycleSort, filterRows, sortRows, type Columns } from './table';

// Expected orders worked by hand. Manuals number their component keys 1, 2, … 10, 11
// (natural order, common practice), and DIN 72552 terminal names such as 15, 15/54, 30, 31
// are read as numbers first.
type Row = { key: string; code: string; length: number | null };
const rows: Row[] = [
	{ key: '10', code: 'G/B', length: 0.5 },
	{ key: '2', code: 'R', length: 1.2 },
	{ key: '1', code: 'g/b', length: null },
	{ key: '15/54', code: 'BK', length: 0.8 },
	{ key: '15', code: 'R/W', length: 0.5 }
];
const columns: Columns<Row, 'key' | 'code' | 'length'> = {
	key: (r) => r.key,
	code: (r) => r.code,
	length: (r) => r.length
};

describe('sortRows', () => {
	it.each([
		{ column: 'key' as const, direction: 'asc' as const, keys: ['1', '2', '10', '15', '15/54'] },
		{ column: 'key' as const, direction: 'desc' as const, keys: ['15/54', '15', '10', '2', '1'] },
		// Equal lengths keep input order (10 before 15); the empty length stays last both ways.
		{ column: 'length' as const, direction: 'asc' as const, keys: ['10', '15', '15/54', '2', '1'] },
		{ column: 'length' as const, direction: 'desc' as const, keys: ['2', '15/54', '10', '15', '1'] }
	])('by $column $direction', ({ column, direction, keys }) => {
		expect(sortRows(rows, columns, { column, direction }).map((r) => r.key)).toEqual(keys);
	});

	it('leaves the input alone and copes with no sort', () => {
		const copy = [...rows];
		expect(sortRows(rows, columns, null)).toEqual(rows);
		sortRows(rows, columns, { column: 'key', direction: 'asc' });
		expect(rows).toEqual(copy);
	});

	it('names an unknown column', () => {
		expect(() => sortRows(rows, columns, { column: 'size' as 'key', direction: 'asc' })).toThrow(/size/);
	});
});

describe('filterRows', () => {
	it.each([
		{ filter: { exact: { code: 'G/B' } }, keys: ['10', '1'], note: 'one code, any letter case' },
		{ filter: { text: 'r' }, keys: ['2', '15'], note: 'text anywhere' },
		{ filter: { text: '15 w' }, keys: ['15'], note: 'all words must match' },
		{ filter: { text: '  ' }, keys: ['10', '2', '1', '15/54', '15'], note: 'blank passes all' },
		{ filter: { exact: { code: 'G/B' }, text: '10' }, keys: ['10'], note: 'both together' }
	])('$note', ({ filter, keys }) => {
		expect(filterRows(rows, columns, filter).map((r) => r.key)).toEqual(keys);
	});
});

describe('compareCells and cycleSort', () => {
	it('orders numbers, text and empties', () => {
		expect(compareCells(2, 10)).toBeLessThan(0);
		expect(compareCells('W2', 'W10')).toBeLessThan(0);
		expect(compareCells('', 'a')).toBeGreaterThan(0);
	});
	it('cycles asc → desc → off', () => {
		const a = cycleSort(null, 'key');
		expect(a).toEqual({ column: 'key', direction: 'asc' });
		const b = cycleSort(a, 'key');
		expect(b).toEqual({ column: 'key', direction: 'desc' });
		expect(cycleSort(b, 'key')).toBeNull();
		expect(cycleSort(b, 'code')).toEqual({ column: 'code', direction: 'asc' });
	});
});
