// zod with Sheaf's settings: a start-up step of its own (web/main.tsx), and imported first by the
// app's start module (web/app/start.tsx) too, so the settings hold wherever the app starts.
import { z } from 'zod';

// zod probes for eval support once at start-up; the CSP forbids eval, so tell zod not to try.
z.config({ jitless: true });
