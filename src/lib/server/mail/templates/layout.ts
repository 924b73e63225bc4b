import { escapeHtml } from './escape';

/**
 * One layout for every mail we send: the content is described once as blocks, and both the
 * HTML part and the plain-text part are rendered from the same blocks, so the two never drift.
 * HTML mail clients ignore stylesheets, hence inline styles and a table-free single column.
 */

/** A mail ready for `sendMail`: the subject, both parts and any extra headers. */
export interface MailContent {
	subject: string;
	html: string;
	text: string;
	/** Extra headers, e.g. `List-Unsubscribe` on mails a recipient can opt out of. */
	headers?: Record<string, string>;
}

export type MailBlock =
	| { kind: 'paragraph'; text: string }
	/** The one thing the mail asks the reader to do: a button in HTML, a bare link in text. */
	| { kind: 'action'; label: string; url: string }
	| { kind: 'list'; items: string[] }
	/** A few figures side by side (wrapping on a narrow screen), e.g. "Due today: 12". */
	| { kind: 'facts'; items: { label: string; value: string }[] }
	/** A section title inside the mail, e.g. one class of a summary. */
	| { kind: 'heading'; text: string }
	/** Small print under the content, such as "ignore this mail if it was not you". */
	| { kind: 'note'; text: string };

export interface MailLayoutInput {
	subject: string;
	/** Opening line, e.g. "Hello Ada,". */
	greeting: string;
	blocks: MailBlock[];
	/** When set, the footer carries an unsubscribe link and the mail gets List-Unsubscribe headers. */
	unsubscribeUrl?: string;
	/**
	 * Where a mail client's one-click unsubscribe POSTs (RFC 8058), when it is not the footer's
	 * page: the footer link opens a page for a person, the header's URL answers a machine.
	 */
	oneClickUrl?: string;
	/** Why the reader gets this mail, said in the footer before the unsubscribe link. */
	reason?: string;
}

/** A template was given a value it cannot put in a mail; the message names the value. */
export class MailTemplateError extends Error {
	name = 'MailTemplateError';
}

// Our palette (src/app.css): ink #0f3d3e, brass #f2b134, paper #fcfaf5.
const palette = {
	ink: '#0f3d3e',
	brass: '#f2b134',
	paper: '#fcfaf5',
	muted: '#4b6b6b',
	tile: '#eef7f6'
};

/**
 * Dark mail clients: the inline colours are the light design, which every client shows; clients
 * that honour `prefers-color-scheme` (and so would otherwise invert our colours on their own) get
 * the dark palette through these classes instead. Nothing depends on the stylesheet being read.
 */
const darkStyle =
	'<style>@media (prefers-color-scheme: dark){' +
	'.tf-page{background:#082222 !important;color:#eef7f6 !important}' +
	'.tf-card{background:#12403e !important;border-color:#17504c !important;color:#eef7f6 !important}' +
	'.tf-tile{background:#17504c !important;color:#eef7f6 !important}' +
	'.tf-muted{color:#a7d6d1 !important}' +
	'.tf-link{color:#f6ca6a !important}' +
	'.tf-head{background:#0f3d3e !important}' +
	'}</style>';
const font = "'Nunito', 'Segoe UI', Helvetica, Arial, sans-serif";

/**
 * Links in mails must be absolute http(s) URLs: a relative or `javascript:` link is a bug in
 * the caller, and a mail client would make it worse.
 * @example checkMailUrl('https://example.com/verify?t=1') // 'https://example.com/verify?t=1'
 */
export function checkMailUrl(url: string): string {
	let parsed: URL;
	try {
		parsed = new URL(url);
	} catch {
		throw new MailTemplateError(`Mail link ${JSON.stringify(url)} is not an absolute URL`);
	}
	if (parsed.protocol !== 'https:' && parsed.protocol !== 'http:') {
		throw new MailTemplateError(`Mail link ${JSON.stringify(url)} must use http or https`);
	}
	return parsed.href;
}

function renderBlockHtml(block: MailBlock): string {
	switch (block.kind) {
		case 'paragraph':
			return `<p style="margin:0 0 16px;line-height:1.55">${escapeHtml(block.text)}</p>`;
		case 'heading':
			return `<h2 style="margin:24px 0 8px;font-size:18px;line-height:1.3">${escapeHtml(block.text)}</h2>`;
		case 'facts':
			return (
				`<div style="margin:0 0 12px">` +
				block.items
					.map(
						(item) =>
							`<div class="tf-tile" style="display:inline-block;vertical-align:top;min-width:112px;` +
							`margin:0 8px 8px 0;padding:10px 14px;border-radius:10px;background:${palette.tile};color:${palette.ink}">` +
							`<div style="font-size:24px;font-weight:700;line-height:1.2">${escapeHtml(item.value)}</div>` +
							`<div class="tf-muted" style="font-size:13px;color:${palette.muted}">${escapeHtml(item.label)}</div></div>`
					)
					.join('') +
				`</div>`
			);
		case 'action': {
			const href = escapeHtml(checkMailUrl(block.url));
			return (
				`<p style="margin:24px 0"><a href="${href}" style="display:inline-block;` +
				`background:${palette.brass};color:${palette.ink};font-weight:700;` +
				`text-decoration:none;padding:12px 22px;border-radius:10px">` +
				`${escapeHtml(block.label)}</a></p>` +
				`<p class="tf-muted" style="margin:0 0 16px;font-size:13px;color:${palette.muted};word-break:break-all">` +
				`Or open this address: <a class="tf-link" href="${href}" style="color:${palette.ink}">${href}</a></p>`
			);
		}
		case 'list':
			return (
				`<ul style="margin:0 0 16px;padding-left:20px;line-height:1.55">` +
				block.items.map((item) => `<li>${escapeHtml(item)}</li>`).join('') +
				`</ul>`
			);
		case 'note':
			return `<p class="tf-muted" style="margin:16px 0 0;font-size:13px;color:${palette.muted}">${escapeHtml(block.text)}</p>`;
	}
}

function renderBlockText(block: MailBlock): string {
	switch (block.kind) {
		case 'paragraph':
		case 'note':
			return block.text;
		case 'heading':
			return `${block.text}\n${'='.repeat(Math.min(block.text.length, 60))}`;
		case 'facts':
			return block.items.map((item) => `${item.label}: ${item.value}`).join('\n');
		case 'action':
			return `${block.label}:\n${checkMailUrl(block.url)}`;
		case 'list':
			return block.items.map((item) => `- ${item}`).join('\n');
	}
}

const defaultReason = 'You get this mail because of your Twelvefold settings.';

function renderHtml(input: MailLayoutInput, unsubscribeUrl: string | null): string {
	const footer = unsubscribeUrl
		? `${escapeHtml(input.reason ?? defaultReason)} ` +
			`<a href="${escapeHtml(unsubscribeUrl)}" style="color:${palette.paper}">Unsubscribe</a>`
		: 'Twelvefold: learn a lick once, own it in all twelve keys.';
	return [
		'<!doctype html>',
		'<html lang="en"><head><meta charset="utf-8">',
		'<meta name="viewport" content="width=device-width, initial-scale=1">',
		'<meta name="color-scheme" content="light dark">',
		'<meta name="supported-color-schemes" content="light dark">',
		`<title>${escapeHtml(input.subject)}</title>`,
		darkStyle,
		'</head>',
		`<body class="tf-page" style="margin:0;padding:0;background:${palette.paper};color:${palette.ink};font-family:${font}">`,
		`<div style="max-width:560px;margin:0 auto;padding:24px 16px">`,
		`<div class="tf-head" style="background:${palette.ink};color:${palette.paper};padding:16px 24px;` +
			`border-radius:14px 14px 0 0;font-weight:700;font-size:18px;letter-spacing:0.02em">` +
			`Twelve<span style="color:${palette.brass}">fold</span></div>`,
		`<div class="tf-card" style="background:#ffffff;padding:24px;border:1px solid #ece3cf;border-top:0">`,
		`<p style="margin:0 0 16px;font-weight:700">${escapeHtml(input.greeting)}</p>`,
		...input.blocks.map(renderBlockHtml),
		'</div>',
		`<div style="background:${palette.ink};color:${palette.paper};padding:12px 24px;` +
			`border-radius:0 0 14px 14px;font-size:12px">${footer}</div>`,
		'</div></body></html>'
	].join('\n');
}

function renderText(input: MailLayoutInput, unsubscribeUrl: string | null): string {
	const footer = unsubscribeUrl
		? `${input.reason ?? defaultReason} Unsubscribe: ${unsubscribeUrl}`
		: 'Twelvefold: learn a lick once, own it in all twelve keys.';
	return [input.greeting, ...input.blocks.map(renderBlockText), '--', footer].join('\n\n') + '\n';
}

/**
 * Render a mail from its blocks into both parts, escaping every value in the HTML part.
 * @example renderMail({ subject: 'Hi', greeting: 'Hello Ada,', blocks: [{ kind: 'paragraph', text: 'One line.' }] }).text // 'Hello Ada,\n\nOne line.\n\n--\n\nTwelvefold: …\n'
 */
export function renderMail(input: MailLayoutInput): MailContent {
	if (/[\r\n]/.test(input.subject)) {
		throw new MailTemplateError(`Mail subject ${JSON.stringify(input.subject)} spans lines`);
	}
	const unsubscribeUrl = input.unsubscribeUrl ? checkMailUrl(input.unsubscribeUrl) : null;
	const oneClickUrl = input.oneClickUrl ? checkMailUrl(input.oneClickUrl) : unsubscribeUrl;
	const mail: MailContent = {
		subject: input.subject,
		html: renderHtml(input, unsubscribeUrl),
		text: renderText(input, unsubscribeUrl)
	};
	if (unsubscribeUrl) {
		// RFC 2369 List-Unsubscribe, plus RFC 8058 one-click so mail clients can offer a button.
		mail.headers = {
			'List-Unsubscribe': `<${oneClickUrl}>`,
			'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click'
		};
	}
	return mail;
}
