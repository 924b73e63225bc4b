import { describe, expect, it } from 'vitest';
import {
	checkMailUrl,
	escapeHtml,
	passwordChangedMail,
	passwordResetMail,
	renderMail,
	verificationMail
} from '$lib/server/mail/templates';

describe('escapeHtml', () => {
	it.each([
		['plain', 'plain'],
		['<b>', '&lt;b&gt;'],
		['"quoted" & \'single\'', '&quot;quoted&quot; &amp; &#39;single&#39;'],
		['&amp; already', '&amp;amp; already'],
		['', '']
	])('turns %j into %j', (input, expected) => {
		expect(escapeHtml(input)).toBe(expected);
	});
});

describe('checkMailUrl', () => {
	it.each([
		['https://twelvefold.test/a?b=1', 'https://twelvefold.test/a?b=1'],
		['http://localhost:3000/verify?token=x', 'http://localhost:3000/verify?token=x']
	])('keeps the absolute http(s) link %s', (input, expected) => {
		expect(checkMailUrl(input)).toBe(expected);
	});

	it.each([
		['a relative path', '/verify?token=x', /is not an absolute URL/],
		['a script link', 'javascript:alert(1)', /must use http or https/],
		['a data link', 'data:text/html,<b>x</b>', /must use http or https/],
		['garbage', 'not a url at all', /is not an absolute URL/]
	])('rejects %s and names it', (_label, input, message) => {
		expect(() => checkMailUrl(input)).toThrow(message);
		expect(() => checkMailUrl(input)).toThrow(JSON.stringify(input));
	});
});

describe('account mails', () => {
	const url = 'https://twelvefold.test/verify?token=t0k&x=1';

	it.each([
		[
			'password reset',
			passwordResetMail,
			'Choose a new Twelvefold password',
			'Choose a new password'
		]
	])(
		'the %s mail has a subject, the link in both parts and no extra headers',
		(_label, template, subject, label) => {
			const mail = template({ name: 'Ada', url });
			expect(mail.subject).toBe(subject);
			expect(mail.headers).toBeUndefined();
			expect(mail.html).toContain(`href="https://twelvefold.test/verify?token=t0k&amp;x=1"`);
			expect(mail.html).toContain(`>${label}</a>`);
			expect(mail.text).toContain(`${label}:\n${url}`);
			expect(mail.text.startsWith('Hello Ada,\n\n')).toBe(true);
		}
	);

	it('escapes a hostile name in the HTML part and keeps it verbatim in the text part', () => {
		const name = '"><img src=x onerror=alert(1)>';
		const mail = passwordResetMail({ name, url });
		expect(mail.html).not.toContain('<img');
		expect(mail.html).toContain('Hello &quot;&gt;&lt;img src=x onerror=alert(1)&gt;,');
		expect(mail.text).toContain(`Hello ${name},`);
	});

	it('greets without a name when the name is blank or withheld', () => {
		expect(passwordResetMail({ name: '   ', url }).text.startsWith('Hello,\n')).toBe(true);
		expect(passwordResetMail({ name: null, url }).text.startsWith('Hello,\n')).toBe(true);
	});

	it('the verification mail takes no name at all: it goes to an address that agreed to nothing', () => {
		const mail = verificationMail({ url });
		expect(mail.subject).toBe('Confirm your e-mail address for Twelvefold');
		expect(mail.headers).toBeUndefined();
		expect(mail.text.startsWith('Hello,\n\n')).toBe(true);
		expect(mail.html).toContain(`href="https://twelvefold.test/verify?token=t0k&amp;x=1"`);
		expect(mail.text).toContain(`Confirm my address:\n${url}`);
	});

	it('says the lifetimes of the links that the server gives them', () => {
		// The lifetimes themselves are in the auth tests; here, the mails say the same numbers.
		expect(verificationMail({ url }).text).toContain('The link works once, for 24 hours.');
		expect(passwordResetMail({ name: null, url }).text).toContain(
			'The link works once, for 60 minutes.'
		);
	});

	it.each([
		['changed', 'Your Twelvefold password was changed', /someone knows your password/],
		['reset', 'Your Twelvefold password was reset', /someone can read this mailbox/]
	] as const)(
		'the password %s mail says when, and what to do if it was not you',
		(how, subject, advice) => {
			const resetUrl = 'https://twelvefold.test/forgot-password';
			const at = new Date('2026-03-02T08:05:00Z');
			const mail = passwordChangedMail({ name: 'Ada', how, at, resetUrl });
			expect(mail.subject).toBe(subject);
			expect(mail.text.startsWith('Hello Ada,\n\n')).toBe(true);
			expect(mail.text).toContain('2026-03-02 at 08:05 UTC');
			expect(mail.text).toMatch(advice);
			expect(mail.text).toContain(`Mail me a reset link:\n${resetUrl}`);
			expect(mail.html).toContain(`href="${resetUrl}"`);
		}
	);

	it('refuses a link that is not an absolute http(s) URL', () => {
		expect(() => passwordResetMail({ name: 'Ada', url: 'javascript:alert(1)' })).toThrow(
			/must use http or https/
		);
	});

	it('uses the palette colours inline, with a dark-scheme override as its only stylesheet', () => {
		const { html } = verificationMail({ url });
		for (const colour of ['#0f3d3e', '#f2b134', '#fcfaf5']) expect(html).toContain(colour);
		expect(html).not.toMatch(/<link/);
		// Clients that drop <style> still get the light design from the inline colours.
		expect(html.match(/<style>[^<]*<\/style>/g)).toEqual([
			expect.stringMatching(/^<style>@media \(prefers-color-scheme: dark\)\{/)
		]);
		expect(html).toContain('<meta name="color-scheme" content="light dark">');
	});
});

describe('renderMail', () => {
	it('renders lists and notes into both parts and adds unsubscribe headers when asked', () => {
		const mail = renderMail({
			subject: 'Due today: 3 licks',
			greeting: 'Hello Bo,',
			blocks: [
				{ kind: 'list', items: ['Lick <one>', 'Lick two'] },
				{ kind: 'note', text: 'Keep playback at a moderate level.' }
			],
			unsubscribeUrl: 'https://twelvefold.test/unsubscribe?t=9'
		});
		expect(mail.text).toBe(
			'Hello Bo,\n\n- Lick <one>\n- Lick two\n\nKeep playback at a moderate level.\n\n--\n\n' +
				'You get this mail because of your Twelvefold settings. Unsubscribe: https://twelvefold.test/unsubscribe?t=9\n'
		);
		expect(mail.html).toContain('<li>Lick &lt;one&gt;</li><li>Lick two</li>');
		expect(mail.html).toContain('href="https://twelvefold.test/unsubscribe?t=9"');
		expect(mail.headers).toEqual({
			'List-Unsubscribe': '<https://twelvefold.test/unsubscribe?t=9>',
			'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click'
		});
	});

	it('refuses a subject with a line break', () => {
		expect(() =>
			renderMail({ subject: 'Hi\nBcc: x@example.com', greeting: 'Hello,', blocks: [] })
		).toThrow(/spans lines/);
	});
});
