/**
 * Keeps the screen on during a sitting (a phone on a music stand must not go dark between
 * prompts). Browsers drop a wake lock whenever the page is hidden, so it is asked for again each
 * time the page comes back. Browser only.
 */

export type WakeState = 'on' | 'off' | 'unsupported';

/**
 * Hold the screen on until the returned function is called; `onChange` hears each change.
 * @example const release = keepScreenOn((s) => console.log(s)); // later: release()
 */
export function keepScreenOn(onChange: (state: WakeState) => void = () => {}): () => void {
	const api = typeof navigator !== 'undefined' ? navigator.wakeLock : undefined;
	if (!api) {
		onChange('unsupported');
		return () => {};
	}
	let sentinel: WakeLockSentinel | null = null;
	let stopped = false;

	async function request() {
		if (stopped || document.visibilityState !== 'visible' || (sentinel && !sentinel.released)) {
			return;
		}
		try {
			sentinel = await api!.request('screen');
			if (stopped) {
				await sentinel.release();
				return;
			}
			onChange('on');
			sentinel.addEventListener('release', () => {
				if (!stopped) onChange('off');
			});
		} catch {
			// Refused (battery saver, a hidden page, a policy): the sitting goes on without it.
			onChange('off');
		}
	}

	const onVisibility = () => void request();
	document.addEventListener('visibilitychange', onVisibility);
	void request();
	return () => {
		stopped = true;
		document.removeEventListener('visibilitychange', onVisibility);
		void sentinel?.release().catch(() => {});
		sentinel = null;
	};
}
