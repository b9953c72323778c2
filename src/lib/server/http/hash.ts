import { createHash } from 'node:crypto';

/** SHA-256 of a string as base64url: fixed-size keys for caches and limiters (not for secrets). */
export const hashKey = (s: string): string => createHash('sha256').update(s).digest('base64url');
