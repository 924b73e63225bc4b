/**
 * What a visitor typed or chose in a form before the page's scripts ran. Hydration writes each
 * bound field back to the state the page was rendered with, so a learner on a slow phone who picks
 * an instrument at once would see the choice undone; src/app.html notes each change, and once the
 * page is live the last one per field is put back, with the events a binding listens to.
 */

/** One change noted before hydration. */
export interface EarlyInput {
	el: HTMLInputElement | HTMLSelectElement | HTMLTextAreaElement;
	value: string;
	checked: boolean;
}

/**
 * Put the noted changes back (the last per field wins) where hydration undid them.
 * @example restoreEarlyInput([{ el: select, value: 'alto-sax', checked: false }]) // 1
 */
export function restoreEarlyInput(early: readonly EarlyInput[]): number {
	const last = new Map<EarlyInput['el'], EarlyInput>();
	for (const entry of early) {
		// A radio button's change is its group's: only the one chosen last counts.
		if (entry.el instanceof HTMLInputElement && entry.el.type === 'radio' && !entry.checked)
			continue;
		last.delete(entry.el);
		last.set(entry.el, entry);
	}
	let restored = 0;
	for (const { el, value, checked } of last.values()) {
		if (!el.isConnected || el.disabled) continue;
		const box = el instanceof HTMLInputElement && (el.type === 'checkbox' || el.type === 'radio');
		if (box) {
			if ((el as HTMLInputElement).checked === checked) continue;
			(el as HTMLInputElement).checked = checked;
		} else {
			if (el.value === value) continue;
			el.value = value;
		}
		el.dispatchEvent(new Event('input', { bubbles: true }));
		el.dispatchEvent(new Event('change', { bubbles: true }));
		restored++;
	}
	return restored;
}
