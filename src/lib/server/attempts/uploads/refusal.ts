// A refusal of a resumable upload, in the words the page shows: the tus hooks throw it and tus answers it as is.

export type Refusal = { status_code: number; body: string };

/** A refusal the upload page shows as it is: a JSON body with a message in the person's words. */
export function refusal(status: number, error: string, message: string): Refusal {
	return { status_code: status, body: JSON.stringify({ error, message }) };
}
