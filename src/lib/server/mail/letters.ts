import { letterHtml, type Letter } from './index';

export function signInLetter(to: string, url: string, host: string): Letter {
	const lines = [
		'Here is your link to sign in to Squarelaw.',
		'It works once and for the next 15 minutes.'
	];
	const footer = `If you did not ask to sign in at ${host}, you can ignore this message; nothing changes.`;
	return {
		to,
		subject: 'Your Squarelaw sign-in link',
		text: `${lines.join('\n')}\n\n${url}\n\n${footer}\n`,
		html: letterHtml(lines, { href: url, label: 'Sign in to Squarelaw' }, footer)
	};
}

export function invitationLetter(
	to: string,
	url: string,
	studioName: string,
	inviterName: string,
	role: string,
	expiresAt: Date
): Letter {
	const lines = [
		`${inviterName} invites you to the studio "${studioName}" on Squarelaw as ${role}.`,
		`The invitation works once and until ${expiresAt.toUTCString()}.`
	];
	const footer = 'If you were not expecting this, ignore the message and nothing changes.';
	return {
		to,
		subject: `Invitation to the studio "${studioName}"`,
		text: `${lines.join('\n')}\n\nAccept: ${url}\n\n${footer}\n`,
		html: letterHtml(lines, { href: url, label: 'Accept the invitation' }, footer)
	};
}

export function workshopInvitationLetter(
	to: string,
	url: string,
	workshopTitle: string,
	inviterName: string,
	role: 'student' | 'instructor',
	expiresAt: Date
): Letter {
	const lines = [
		`${inviterName} invites you to the workshop "${workshopTitle}" on Squarelaw as ${role === 'student' ? 'a student' : 'an instructor'}.`,
		`The link works once and until ${expiresAt.toUTCString()}.`
	];
	const footer = 'If you were not expecting this, ignore the message and nothing changes.';
	return {
		to,
		subject: `Invitation to the workshop "${workshopTitle}"`,
		text: `${lines.join('\n')}\n\nJoin: ${url}\n\n${footer}\n`,
		html: letterHtml(lines, { href: url, label: 'Join the workshop' }, footer)
	};
}

export function seatReceiptLetter(to: string, workshopTitle: string, amount: string, paidAt: Date, bookingId: string, url: string): Letter {
	const lines = [
		`Thank you: your seat in the workshop "${workshopTitle}" is booked, and you are now one of its students.`,
		`Paid: ${amount} on ${paidAt.toUTCString()}.`,
		`Booking reference: ${bookingId}.`
	];
	const footer = 'Keep this message as your receipt. If the instructor cancels your booking, the payment is returned in full.';
	return {
		to,
		subject: `Receipt: your seat in "${workshopTitle}"`,
		text: `${lines.join('\n')}\n\nOpen the workshop: ${url}\n\n${footer}\n`,
		html: letterHtml(lines, { href: url, label: 'Open the workshop' }, footer)
	};
}

export function seatRefundLetter(to: string, workshopTitle: string, amount: string, reason: string, bookingId: string, url: string): Letter {
	const lines = [
		`Your payment of ${amount} for a seat in the workshop "${workshopTitle}" has been refunded in full.`,
		`Why: ${reason}`,
		`Booking reference: ${bookingId}. The money reaches your account in the payment provider's usual time.`
	];
	const footer = 'Nothing else is charged. Reply to the instructor if you have a question.';
	return {
		to,
		subject: `Refund: your seat in "${workshopTitle}"`,
		text: `${lines.join('\n')}\n\nThe workshop's page: ${url}\n\n${footer}\n`,
		html: letterHtml(lines, { href: url, label: "The workshop's page" }, footer)
	};
}

export function handInReviewedLetter(to: string, url: string, exerciseTitle: string, reviewerName: string, state: 'accepted' | 'another-try', feedback: string): Letter {
	const lines = [
		`${reviewerName} has reviewed your hand-in of "${exerciseTitle}": ${state === 'accepted' ? 'accepted' : 'another try, please'}.`,
		...(feedback.trim() ? ['Their feedback:', feedback.trim()] : [])
	];
	const footer = 'You get this message because you handed in this exercise on Squarelaw.';
	return {
		to,
		subject: `Your hand-in of "${exerciseTitle}": ${state === 'accepted' ? 'accepted' : 'another try'}`,
		text: `${lines.join('\n')}\n\nOpen it: ${url}\n\n${footer}\n`,
		html: letterHtml(lines, { href: url, label: 'Open the hand-in' }, footer)
	};
}
