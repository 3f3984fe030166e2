/**
 * A small XML layer over fast-xml-parser (no DOM: the engine also runs on the server): a
 * namespace-aware element tree for the readers, and a writer that keeps element order exactly as
 * built, since the GPX and RTZ schemas are sequences where order is part of validity.
 */
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { stripBom } from './shared';

export interface XmlNode {
	/** Qualified name as written, e.g. "wl:line". */
	name: string;
	/** Name without prefix. */
	local: string;
	/** Resolved namespace URI ('' when none). */
	ns: string;
	attrs: Record<string, string>;
	children: XmlNode[];
	/** Concatenated text and CDATA directly inside this element. */
	text: string;
}

export type XmlParsed = { ok: true; root: XmlNode } | { ok: false; message: string };

type OrderedNode = Record<string, unknown> & { ':@'?: Record<string, string> };

const parser = new XMLParser({
	preserveOrder: true,
	ignoreAttributes: false,
	attributeNamePrefix: '',
	parseTagValue: false,
	parseAttributeValue: false,
	trimValues: false,
	cdataPropName: '#cdata',
	ignoreDeclaration: true,
	ignorePiTags: true,
	// Deprecated name, but it is the switch that decodes numeric references such as &#10; (which
	// our writer uses for line breaks in attributes); it also accepts common HTML named entities.
	htmlEntities: true
});

/** Parse XML text; never throws. Broken input gives "not well-formed XML at line N: …". */
export function parseXml(input: string): XmlParsed {
	const text = stripBom(input);
	const valid = XMLValidator.validate(text);
	if (valid !== true) {
		return {
			ok: false,
			message: `not well-formed XML at line ${valid.err.line}: ${valid.err.msg}`
		};
	}
	let ordered: OrderedNode[];
	try {
		ordered = parser.parse(text) as OrderedNode[];
	} catch (e) {
		return {
			ok: false,
			message: `not well-formed XML: ${e instanceof Error ? e.message : String(e)}`
		};
	}
	const scope = { '': '' } as Record<string, string>;
	for (const node of ordered) {
		const el = convert(node, scope);
		if (el) return { ok: true, root: el };
	}
	return { ok: false, message: 'no XML root element found' };
}

function convert(node: OrderedNode, parentScope: Record<string, string>): XmlNode | null {
	const name = Object.keys(node).find((k) => k !== ':@');
	if (
		!name ||
		name === '#text' ||
		name === '#cdata' ||
		name.startsWith('?') ||
		name.startsWith('!')
	) {
		return null;
	}
	const attrs = { ...(node[':@'] ?? {}) };
	let scope = parentScope;
	for (const [k, v] of Object.entries(attrs)) {
		if (k === 'xmlns' || k.startsWith('xmlns:')) {
			if (scope === parentScope) scope = { ...parentScope };
			scope[k === 'xmlns' ? '' : k.slice(6)] = v;
		}
	}
	const colon = name.indexOf(':');
	const prefix = colon >= 0 ? name.slice(0, colon) : '';
	const el: XmlNode = {
		name,
		local: colon >= 0 ? name.slice(colon + 1) : name,
		ns: scope[prefix] ?? '',
		attrs,
		children: [],
		text: ''
	};
	for (const c of (node[name] as OrderedNode[]) ?? []) {
		if ('#text' in c) el.text += String(c['#text']);
		else if ('#cdata' in c) {
			for (const t of (c['#cdata'] as OrderedNode[]) ?? []) el.text += String(t['#text'] ?? '');
		} else {
			const child = convert(c, scope);
			if (child) el.children.push(child);
		}
	}
	return el;
}

export function childrenNamed(node: XmlNode, local: string, ns?: string): XmlNode[] {
	return node.children.filter((c) => c.local === local && (ns === undefined || c.ns === ns));
}

export function childNamed(node: XmlNode, local: string, ns?: string): XmlNode | undefined {
	return node.children.find((c) => c.local === local && (ns === undefined || c.ns === ns));
}

/** Trimmed text of a child element, or undefined when there is none. */
export function childText(node: XmlNode, local: string, ns?: string): string | undefined {
	const c = childNamed(node, local, ns);
	return c ? c.text.trim() : undefined;
}

// ---------------------------------------------------------------------------------------------
// Writing

export interface XmlOut {
	name: string;
	attrs?: Record<string, string | number | null | undefined>;
	children?: (XmlOut | null | undefined | false)[];
	text?: string;
}

// Characters XML 1.0 forbids even as references; they cannot be carried, so they are dropped.
const INVALID =
	// eslint-disable-next-line no-control-regex -- these are exactly the characters to remove
	/[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;

export function escapeText(s: string): string {
	return s.replace(INVALID, '').replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

/** Attribute values also escape quotes and line breaks, which a parser would turn into spaces. */
export function escapeAttr(s: string): string {
	return escapeText(s)
		.replace(/"/g, '&quot;')
		.replace(/\n/g, '&#10;')
		.replace(/\r/g, '&#13;')
		.replace(/\t/g, '&#9;');
}

function renderNode(node: XmlOut, depth: number, out: string[]): void {
	const indent = '\t'.repeat(depth);
	const attrs = Object.entries(node.attrs ?? {})
		.filter(([, v]) => v !== undefined && v !== null)
		.map(([k, v]) => ` ${k}="${escapeAttr(String(v))}"`)
		.join('');
	const kids = (node.children ?? []).filter((c): c is XmlOut => !!c);
	if (kids.length === 0 && (node.text === undefined || node.text === '')) {
		out.push(`${indent}<${node.name}${attrs}/>`);
	} else if (kids.length === 0) {
		out.push(`${indent}<${node.name}${attrs}>${escapeText(node.text ?? '')}</${node.name}>`);
	} else {
		out.push(`${indent}<${node.name}${attrs}>`);
		for (const k of kids) renderNode(k, depth + 1, out);
		out.push(`${indent}</${node.name}>`);
	}
}

/** A whole document: declaration, an optional comment (e.g. the export caution), the root. */
export function renderXml(root: XmlOut, comment?: string): string {
	const out = ['<?xml version="1.0" encoding="UTF-8"?>'];
	if (comment)
		out.push(`<!-- ${comment.replace(INVALID, '').replace(/--/g, '- -').replace(/-$/, '- ')} -->`);
	renderNode(root, 0, out);
	return out.join('\n') + '\n';
}
