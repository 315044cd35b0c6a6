// Forms of billing: how many seats to pay for. Shared by sign-up and the billing page.
import { z } from 'zod';

export const MAX_SEATS = 1000;

export const seatCount = z
	.number({ error: 'Enter a number of seats.' })
	.int({ error: 'Seats come in whole numbers.' })
	.min(1, { error: 'A workspace needs at least one seat.' })
	.max(MAX_SEATS, { error: `For more than ${MAX_SEATS} seats, write to us.` })
	.describe('Seats to pay for, one per member');

export const seatsSchema = z.object({ seats: seatCount });
