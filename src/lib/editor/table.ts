// Sorting and filtering for the component key and the wire list. Key numbers and terminal
// names sort the way a manual numbers them: "2" before "10", "15/54" after "15".

export type SortDirection = 'asc' | 'desc';
export type SortSpec<C extends string> = { column: C; direction: SortDirection };

/** Cell text for each column of a row. */
export type Columns<R, C extends string> = Record<C, (row: R) => string | number | null | undefined>;

const collator = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });

/** Compares two cells: numbers numerically, text in manual order, empty cells last. */
export function compareCells(a: string | number | null | undefined, b: string | number | null | undefined): number {
	const emptyA = a === null || a === undefined || a === '';
	const emptyB = b === null || b === undefined || b === '';
	if (emptyA || emptyB) return emptyA === emptyB ? 0 : emptyA ? 1 : -1;
	if (typeof a === 'number' && typeof b === 'number') return a - b;
	return collator.compare(String(a), String(b));
}

/**
 * Rows sorted by one column; equal rows keep their order (Array.prototype.sort is stable, ES2019).
 * Empty cells stay at the end in both directions.
 * @example sortRows(wires, columns, { column: 'code', direction: 'asc' })
 */
export function sortRows<R, C extends string>(rows: readonly R[], columns: Columns<R, C>, sort: SortSpec<C> | null): R[] {
	if (!sort) return [...rows];
	const cell = columns[sort.column];
	if (!cell) throw new Error(`sortRows: no column "${sort.column}"`);
	const sign = sort.direction === 'asc' ? 1 : -1;
	return rows
		.map((row, index) => ({ row, index, value: cell(row) }))
		.sort((a, b) => {
			const emptyA = a.value === null || a.value === undefined || a.value === '';
			const emptyB = b.value === null || b.value === undefined || b.value === '';
			if (emptyA || emptyB) return emptyA === emptyB ? a.index - b.index : emptyA ? 1 : -1;
			return sign * compareCells(a.value, b.value) || a.index - b.index;
		})
		.map((x) => x.row);
}

export type Filter<C extends string> = {
	/** Words that must all appear somewhere in the row (any column), case-insensitive. */
	text?: string;
	/** Exact cell values per column, case-insensitive ("all wires of code G/B"). */
	exact?: Partial<Record<C, string>>;
};

/**
 * Rows that pass the filter.
 * @example filterRows(wires, columns, { exact: { code: 'G/B' } })
 */
export function filterRows<R, C extends string>(rows: readonly R[], columns: Columns<R, C>, filter: Filter<C>): R[] {
	const words = (filter.text ?? '').toLowerCase().split(/\s+/).filter(Boolean);
	const exact = Object.entries(filter.exact ?? {}).filter(([, v]) => typeof v === 'string' && v !== '') as [C, string][];
	for (const [c] of exact) if (!columns[c]) throw new Error(`filterRows: no column "${c}"`);
	if (!words.length && !exact.length) return [...rows];
	const names = Object.keys(columns) as C[];
	return rows.filter((row) => {
		for (const [c, v] of exact) if (String(columns[c](row) ?? '').toLowerCase() !== v.toLowerCase()) return false;
		if (!words.length) return true;
		const text = names.map((c) => String(columns[c](row) ?? '')).join('\u0000').toLowerCase();
		return words.every((w) => text.includes(w));
	});
}

/** The next sort when a column header is pressed: ascending, then descending, then off. */
export function cycleSort<C extends string>(current: SortSpec<C> | null, column: C): SortSpec<C> | null {
	if (!current || current.column !== column) return { column, direction: 'asc' };
	if (current.direction === 'asc') return { column, direction: 'desc' };
	return null;
}
