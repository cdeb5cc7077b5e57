import type { User } from './user.entity';

/** A user as the API shows them to themselves. */
export interface UserView {
  id: string;
  email: string;
  displayName: string;
  createdAt: string;
}

export function toUserView(user: User): UserView {
  return { id: user.id, email: user.email, displayName: user.displayName, createdAt: user.createdAt.toISOString() };
}
