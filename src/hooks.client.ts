import { z } from 'zod';

// zod probes whether it may compile parsers with `new Function`; the
// Content-Security-Policy forbids that (no 'unsafe-eval'), and the probe
// would be reported as a violation on every page that validates. Parse
// without compiling in the browser instead.
z.config({ jitless: true });
