// How big each part of a resumable frame upload is: small enough that the server's request limit (BODY_SIZE_LIMIT)
// stays small and a dropped part costs little to send again, large enough that a 40 MB frame is ten requests.
export const UPLOAD_PART_BYTES = 4 * 1024 * 1024;
