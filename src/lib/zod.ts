/**
 * zod, configured once: every module takes `z` from here, never from 'zod' directly. In the browser
 * zod must not generate code: its object parser compiles a fast path with `new Function`, and even
 * its probe for that is reported as a CSP script-src eval violation on every page. The server keeps
 * the fast path (about 3× quicker on the evaluate API's body; no CSP applies there).
 */
import { z } from 'zod';

z.config({ jitless: typeof window !== 'undefined' });

export { z };
