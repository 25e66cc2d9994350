// Browser start-up. zod 4 probes whether it may compile validators with `new Function`; under
// our content security policy (no 'unsafe-eval') that probe is refused and reported as a CSP
// violation on every page that parses a schema. jitless skips the probe and the compiled path.
import { z } from 'zod';

z.config({ jitless: true });
