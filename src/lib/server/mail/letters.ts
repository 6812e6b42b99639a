import { letterHtml, type Letter } from './index';

/**
 * A letter's plain text and HTML, from the same paragraphs, link and footer. In the text the link stands
 * on its own line after `textLead` ("Accept: https://…"), or bare when there is none.
 */
function letter(to: string, subject: string, lines: string[], link: { href: string; label: string; textLead: string }, footer: string): Letter {
	const linkLine = link.textLead ? `${link.textLead}: ${link.href}` : link.href;
	return { to, subject, text: `${lines.join('\n')}\n\n${linkLine}\n\n${footer}\n`, html: letterHtml(lines, link, footer) };
}

const NOT_EXPECTED = 'If you were not expecting this, ignore the message and nothing changes.';

export function signInLetter(to: string, url: string, host: string): Letter {
	const lines = [
		'Here is your link to sign in to Squarelaw.',
		'It works once and for the next 15 minutes.'
	];
	const footer = `If you did not ask to sign in at ${host}, you can ignore this message; nothing changes.`;
	return letter(to, 'Your Squarelaw sign-in link', lines, { href: url, label: 'Sign in to Squarelaw', textLead: '' }, footer);
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
	return letter(to, `Invitation to the studio "${studioName}"`, lines, { href: url, label: 'Accept the invitation', textLead: 'Accept' }, NOT_EXPECTED);
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
	return letter(to, `Invitation to the workshop "${workshopTitle}"`, lines, { href: url, label: 'Join the workshop', textLead: 'Join' }, NOT_EXPECTED);
}

export function seatReceiptLetter(to: string, workshopTitle: string, amount: string, paidAt: Date, bookingId: string, url: string): Letter {
	const lines = [
		`Thank you: your seat in the workshop "${workshopTitle}" is booked, and you are now one of its students.`,
		`Paid: ${amount} on ${paidAt.toUTCString()}.`,
		`Booking reference: ${bookingId}.`
	];
	const footer = 'Keep this message as your receipt. If the instructor cancels your booking, the payment is returned in full.';
	return letter(to, `Receipt: your seat in "${workshopTitle}"`, lines, { href: url, label: 'Open the workshop', textLead: 'Open the workshop' }, footer);
}

export function seatRefundLetter(to: string, workshopTitle: string, amount: string, reason: string, bookingId: string, url: string): Letter {
	const lines = [
		`Your payment of ${amount} for a seat in the workshop "${workshopTitle}" has been refunded in full.`,
		`Why: ${reason}`,
		`Booking reference: ${bookingId}. The money reaches your account in the payment provider's usual time.`
	];
	const footer = 'Nothing else is charged. Reply to the instructor if you have a question.';
	return letter(to, `Refund: your seat in "${workshopTitle}"`, lines, { href: url, label: "The workshop's page", textLead: "The workshop's page" }, footer);
}

export function handInReviewedLetter(to: string, url: string, exerciseTitle: string, reviewerName: string, state: 'accepted' | 'another-try', feedback: string): Letter {
	const lines = [
		`${reviewerName} has reviewed your hand-in of "${exerciseTitle}": ${state === 'accepted' ? 'accepted' : 'another try, please'}.`,
		...(feedback.trim() ? ['Their feedback:', feedback.trim()] : [])
	];
	const footer = 'You get this message because you handed in this exercise on Squarelaw.';
	return letter(to, `Your hand-in of "${exerciseTitle}": ${state === 'accepted' ? 'accepted' : 'another try'}`, lines, { href: url, label: 'Open the hand-in', textLead: 'Open it' }, footer);
}
