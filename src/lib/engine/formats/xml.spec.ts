import { describe, expect, it } from 'vitest';
import { childNamed, parseXml, renderXml } from './xml';

describe('xml', () => {
	it('writes text and attributes that read back unchanged', () => {
		const tricky = 'a & b < c > "d" \'e\'\nnext\tline — °′″';
		const xml = renderXml(
			{ name: 'r', attrs: { v: tricky }, children: [{ name: 't', text: tricky }] },
			'a -- comment-'
		);
		const p = parseXml(xml);
		if (!p.ok) throw new Error(p.message);
		expect(p.root.attrs.v).toBe(tricky);
		expect(childNamed(p.root, 't')!.text).toBe(tricky);
	});

	it('drops characters XML 1.0 cannot carry [published] XML 1.0 §2.2 Char', () => {
		const xml = renderXml({ name: 'r', children: [{ name: 't', text: 'a\u0000b\u001Fc\uFFFEd' }] });
		const p = parseXml(xml);
		expect(p.ok && childNamed(p.root, 't')!.text).toBe('abcd');
	});

	it('resolves namespaces of prefixed and default elements', () => {
		const p = parseXml('<a xmlns="urn:a" xmlns:b="urn:b"><b:x/><y xmlns="urn:c"><z/></y></a>');
		if (!p.ok) throw new Error(p.message);
		expect(p.root.ns).toBe('urn:a');
		expect(p.root.children[0]).toMatchObject({ local: 'x', ns: 'urn:b' });
		expect(p.root.children[1].children[0]).toMatchObject({ local: 'z', ns: 'urn:c' });
	});

	it('reports where XML breaks, and empty input', () => {
		expect(parseXml('<a>\n<b>\n</a>')).toMatchObject({
			ok: false,
			message: expect.stringMatching(/at line 3/)
		});
		expect(parseXml('')).toMatchObject({ ok: false });
		expect(parseXml('plain text')).toMatchObject({ ok: false });
	});
});
