// Password hashing: argon2id with OWASP's minimum parameters (19 MiB, 2 passes, 1 lane).
import { hash, verify } from '@node-rs/argon2';

const options = { memoryCost: 19456, timeCost: 2, outputLen: 32, parallelism: 1 } as const;

export function hashPassword(password: string): Promise<string> {
	return hash(password, options);
}

export function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
	return verify(passwordHash, password, options).catch(() => false);
}
