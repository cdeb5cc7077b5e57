import type { TeamRole } from './team-role';

export interface TeamView {
  id: string;
  name: string;
  /** The caller's own role in this team. */
  role: TeamRole;
  memberCount: number;
  createdAt: string;
}

export interface MemberView {
  userId: string;
  email: string;
  displayName: string;
  role: TeamRole;
  joinedAt: string;
  lastSignInAt: string | null;
}
