import type { User } from './user.entity';

import type { UserView } from '@fieldbound/shared';

export type { UserView };

export function toUserView(user: User): UserView {
  return { id: user.id, email: user.email, displayName: user.displayName, createdAt: user.createdAt.toISOString() };
}
