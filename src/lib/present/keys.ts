/**
 * The present view's keys: what a keyboard and a presentation clicker send. Clickers send Page Down
 * and Page Up (some the arrows, and B or "." to blank the screen), so every one of them steps.
 * While the plan itself has keyboard focus, the arrows and Space belong to the plan (they move the
 * picked light, or pan), as they do in the editor; Page Up/Down, Home, End, F and B still step.
 */
export type PresentAction = 'next' | 'previous' | 'first' | 'last' | 'fullscreen' | 'blank';

export interface PresentKeyInput {
	key: string;
	shiftKey?: boolean;
	ctrlKey?: boolean;
	metaKey?: boolean;
	altKey?: boolean;
}

const PLAN_KEYS: ReadonlySet<string> = new Set(['ArrowRight', 'ArrowLeft', 'ArrowUp', 'ArrowDown', ' ']);

/** The action a key stands for in the present view, or null (the key is left to the browser or the plan). */
export function presentAction(input: PresentKeyInput, options: { planFocused?: boolean } = {}): PresentAction | null {
	if (input.ctrlKey || input.metaKey || input.altKey) return null;
	if (options.planFocused && PLAN_KEYS.has(input.key)) return null;
	switch (input.key) {
		case 'ArrowRight':
		case 'ArrowDown':
		case 'PageDown':
			return 'next';
		case ' ':
			return input.shiftKey ? 'previous' : 'next';
		case 'ArrowLeft':
		case 'ArrowUp':
		case 'PageUp':
			return 'previous';
		case 'Home':
			return 'first';
		case 'End':
			return 'last';
		case 'f':
		case 'F':
			return 'fullscreen';
		case 'b':
		case 'B':
		case '.':
			return 'blank';
		default:
			return null;
	}
}

/** The keys as the help line under the present view lists them. */
export const PRESENT_KEY_HELP: readonly { keys: string; what: string }[] = [
	{ keys: '→ ↓ Space Page Down', what: 'next step' },
	{ keys: '← ↑ Page Up', what: 'previous step' },
	{ keys: 'Home / End', what: 'first / last step' },
	{ keys: 'F', what: 'full screen' },
	{ keys: 'B', what: 'blank the screen (again to return)' }
];
