import { SetMetadata } from '@nestjs/common';

export const IS_PUBLIC_KEY = 'fieldbound:isPublic';

/**
 * Marks a route (or a whole controller) as callable without an access token.
 * Every other route requires a valid JWT access token: the global JwtAuthGuard enforces it.
 */
export const Public = () => SetMetadata(IS_PUBLIC_KEY, true);
