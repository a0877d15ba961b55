import { z } from 'zod';

// zod probes whether it may compile parsers with Function(); the pages' Content-Security-Policy
// forbids that ('unsafe-eval' is not allowed), so the probe only fails and is reported as a
// violation. Parse without compiling, as zod would after the failed probe anyway.
z.config({ jitless: true });
