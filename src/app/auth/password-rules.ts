import type { PASSWORD_MAX as SharedMax, PASSWORD_MIN as SharedMin } from '../../../shared/auth';

// Restated rather than imported: shared/auth builds its zod schemas on load,
// and these pages need only two numbers. The types keep them equal to shared/.
export const PASSWORD_MIN: typeof SharedMin = 10;
export const PASSWORD_MAX: typeof SharedMax = 200;
