/**
 * A form field with an error is marked invalid and described by the error's text, so a screen reader
 * reads the message with the field; `FieldError.svelte` writes that text, announced as it appears.
 */
export const fieldErrorId = (fieldId: string) => `${fieldId}-error`;

/** Spread onto the field (or its fieldset): nothing while the field has no error. */
export function invalidIf(fieldId: string, message: string | null | undefined): { 'aria-invalid'?: 'true'; 'aria-describedby'?: string } {
	return message ? { 'aria-invalid': 'true', 'aria-describedby': fieldErrorId(fieldId) } : {};
}
