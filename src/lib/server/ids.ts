import { encodeBase32LowerCaseNoPadding, encodeHexLowerCase } from '@oslojs/encoding';
import { sha256 } from '@oslojs/crypto/sha2';

/** A random identifier (80 bits) for rows. */
export function newId(): string {
	return encodeBase32LowerCaseNoPadding(crypto.getRandomValues(new Uint8Array(10)));
}

/** A secret token (144 bits) for cookies, links and API tokens; only its hash is stored. */
export function newSecret(): string {
	return encodeBase32LowerCaseNoPadding(crypto.getRandomValues(new Uint8Array(18)));
}

export function hashSecret(secret: string): string {
	return encodeHexLowerCase(sha256(new TextEncoder().encode(secret)));
}
