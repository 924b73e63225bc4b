/**
 * Escaping for values interpolated into mail HTML. Names, deck titles and comments come from
 * users, so every one of them passes through here before it reaches a template.
 */

const entities: Record<string, string> = {
	'&': '&amp;',
	'<': '&lt;',
	'>': '&gt;',
	'"': '&quot;',
	"'": '&#39;'
};

/**
 * Replace the five characters that can open markup or end an attribute value.
 * @example escapeHtml('<b>"Al" & co</b>') // '&lt;b&gt;&quot;Al&quot; &amp; co&lt;/b&gt;'
 */
export function escapeHtml(value: string): string {
	return value.replace(/[&<>"']/g, (char) => entities[char]);
}
