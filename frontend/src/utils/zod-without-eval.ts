import { config } from 'zod';

// Brimwatch's Content-Security-Policy allows no eval. zod probes for it (new Function) when an object
// schema is built, and the browser reports that probe as a CSP violation; jitless skips the probe.
// Import this module before any module that builds a zod schema.
config({ jitless: true });
