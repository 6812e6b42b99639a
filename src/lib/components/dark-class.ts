/**
 * The dim-studio scheme is the `dark` class on <html> (set before paint by static/theme.js and by the
 * header's toggle; the print handler lifts it while printing). Components that draw their own colours
 * (the plan's canvas) or show the scheme (the toggle) follow it here. Browser only.
 */
export function watchDarkClass(onChange: (dark: boolean) => void): () => void {
	const html = document.documentElement;
	const read = () => onChange(html.classList.contains('dark'));
	read();
	const observer = new MutationObserver(read);
	observer.observe(html, { attributes: true, attributeFilter: ['class'] });
	return () => observer.disconnect();
}
