/**
 * The notebook forms' `use:enhance`: what the user typed stays in the form after the answer (no reset,
 * so a refused save loses nothing), and the form reads as busy until the page has the answer.
 *
 *   use:enhance={keepTyped((b) => (busy = b))}
 */
import type { ActionResult, SubmitFunction } from '@sveltejs/kit';

export function keepTyped(setBusy: (busy: boolean) => void, done?: (result: ActionResult, form: HTMLFormElement) => void): SubmitFunction {
	return () => {
		setBusy(true);
		return async ({ update, result, formElement }) => {
			await update({ reset: false });
			setBusy(false);
			done?.(result, formElement);
		};
	};
}
