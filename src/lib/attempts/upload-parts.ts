// How big each part of a resumable frame upload is: small enough that the server's request limit (BODY_SIZE_LIMIT, 16M)
// stays small and a dropped part costs little to send again, large enough that a 40 MB frame is five requests and that
// each part is one part of an S3 multipart upload when the uploads wait in the bucket (S3's minimum is 5 MiB).
export const UPLOAD_PART_BYTES = 8 * 1024 * 1024;
