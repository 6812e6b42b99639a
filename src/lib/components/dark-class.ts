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

/**
 * Paper is white: lifts the `dark` class while the page prints and puts it back after; `beforePrint`
 * runs once the light theme is on (e.g. to take a light image of the plan). Returns the clean-up.
 */
export function printInLightTheme(beforePrint?: () => void): () => void {
	const root = document.documentElement;
	let wasDark = false;
	const before = () => {
		wasDark = root.classList.contains('dark');
		root.classList.remove('dark');
		beforePrint?.();
	};
	const after = () => {
		if (wasDark) root.classList.add('dark');
	};
	window.addEventListener('beforeprint', before);
	window.addEventListener('afterprint', after);
	return () => {
		window.removeEventListener('beforeprint', before);
		window.removeEventListener('afterprint', after);
	};
}
