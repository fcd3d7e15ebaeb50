import { z } from 'zod';

// Zod's fast path probes for eval, which the strict Content-Security-Policy (no 'unsafe-eval') forbids.
z.config({ jitless: true });
