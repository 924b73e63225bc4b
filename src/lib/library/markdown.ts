import MarkdownIt from 'markdown-it';

/**
 * Teaching notes are Markdown written by teachers and read by anyone the lick is shared with:
 * raw HTML is off (it shows as text), links open only to http(s) and mail addresses.
 */
const md = new MarkdownIt({ html: false, linkify: true, breaks: false, typographer: false });
const SAFE_LINK = /^(https?:|mailto:)/i;
md.validateLink = (url: string) => SAFE_LINK.test(url.trim());

/**
 * Safe HTML for a teaching note.
 * @example renderNote('The **9** leads up') // '<p>The <strong>9</strong> leads up</p>\n'
 */
export function renderNote(markdown: string): string {
	return md.render(markdown);
}
