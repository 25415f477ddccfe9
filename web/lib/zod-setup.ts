// zod with Sheaf's settings; imported first by the app's start module (web/app/start.tsx).
import { z } from 'zod';

// zod probes for eval support once at start-up; the CSP forbids eval, so tell zod not to try.
z.config({ jitless: true });
