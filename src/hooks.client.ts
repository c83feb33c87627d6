import { z } from 'zod';

// zod compiles fast object parsers with `new Function` when it can, and finds out whether it can
// by trying; under the app's Content-Security-Policy (no 'unsafe-eval') that try is reported as a
// violation. Form checks in the browser are small: the interpreted parser is quick enough.
z.config({ jitless: true });
