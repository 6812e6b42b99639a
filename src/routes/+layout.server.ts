export function load({ locals }) {
	return {
		user: locals.user ? { id: locals.user.id, name: locals.user.name, email: locals.user.email, isAdmin: locals.user.isAdmin, unitSystem: locals.user.unitSystem } : null
	};
}
