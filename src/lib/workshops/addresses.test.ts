import { describe, expect, it } from 'vitest';
import { mergeAddressLists, parseAddressCsv, parseAddressText } from './addresses';

describe('invitation lists', () => {
	it('reads pasted addresses one a line or separated by commas and semicolons, names the bad ones', () => {
		const list = parseAddressText('ines.marlow@fernhill.example, Pebble Finch <pebble.finch@fernhill.example>\nnot-an-address;\n  OTTO.BRAM@fernhill.example ; ines.marlow@fernhill.example\nmara@');
		expect(list.valid).toEqual(['ines.marlow@fernhill.example', 'pebble.finch@fernhill.example', 'otto.bram@fernhill.example']);
		expect(list.invalid.map((i) => i.entry)).toEqual(['not-an-address', 'mara@']);
		expect(list.invalid[0].message).toMatch(/not an e-mail address/);
	});

	it('takes the e-mail column of a CSV file with a header, quotes and all', () => {
		const csv = '\uFEFFname,email,level\r\n"Finch, Pebble",pebble.finch@fernhill.example,new\r\nOtto Bram,otto.bram@fernhill,club\r\n';
		const list = parseAddressCsv(csv);
		expect(list.valid).toEqual(['pebble.finch@fernhill.example']);
		expect(list.invalid).toEqual([{ entry: 'otto.bram@fernhill', message: expect.any(String) }]);
	});

	it('takes the first column of a CSV file without a header, and merges with pasted text', () => {
		const csv = parseAddressCsv('ines.marlow@fernhill.example;Ines\nwren@fernhill.example;Tobias');
		expect(csv.valid).toEqual(['ines.marlow@fernhill.example', 'wren@fernhill.example']);
		const both = mergeAddressLists(parseAddressText('wren@fernhill.example\nbad'), csv);
		expect(both.valid).toEqual(['wren@fernhill.example', 'ines.marlow@fernhill.example']);
		expect(both.invalid.map((i) => i.entry)).toEqual(['bad']);
	});

	it('an empty list is empty', () => {
		expect(parseAddressText(' \n ,;')).toEqual({ valid: [], invalid: [] });
		expect(parseAddressCsv('')).toEqual({ valid: [], invalid: [] });
	});
});
