import { z } from 'zod';

/**
 * zod 4 compiles object parsers with `new Function` unless told not to, and probes for it when
 * the first object schema is built; under our Content-Security-Policy (no 'unsafe-eval') that
 * probe is refused and reported as a violation even though zod catches it. Every island imports
 * this module first, so the setting is in place before any schema module runs in the browser.
 */
z.config({ jitless: true });
