import { describe, expect, it } from 'vitest';
import { fieldErrors, pathString, under } from './issues';

describe('issue paths', () => {
	it.each([
		[[], ''],
		[['name'], 'name'],
		[['parts', 0, 'kind'], 'parts[0].kind'],
		[['wires', 3, 'to', 'terminal'], 'wires[3].to.terminal']
	] as [PropertyKey[], string][])('%j reads %s', (path, text) => expect(pathString(path)).toBe(text));

	it('puts a document path under its field', () => {
		expect(under('document', 'parts[0].kind')).toBe('document.parts[0].kind');
		expect(under('document', '')).toBe('document');
		expect(under('document', '(document)')).toBe('document');
		expect(under('document', '[2]')).toBe('document[2]');
	});

	it('keeps the first message per top-level field', () => {
		expect(
			fieldErrors([
				{ path: 'name', message: 'first' },
				{ path: 'name', message: 'second' },
				{ path: 'document.parts[0]', message: 'deep' },
				{ path: '', message: 'whole' }
			])
		).toEqual({ name: 'first', document: 'deep', form: 'whole' });
	});
});
