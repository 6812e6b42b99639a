// Applies the saved colour scheme before the first paint, so a dim studio never sees a white flash.
// Kept as a static file so the content security policy needs no inline script.
(function () {
	try {
		var saved = localStorage.getItem('squarelaw-theme');
		var dark = saved ? saved === 'dark' : window.matchMedia('(prefers-color-scheme: dark)').matches;
		document.documentElement.classList.toggle('dark', dark);
	} catch (e) {}
})();
