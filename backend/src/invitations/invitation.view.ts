import type { TeamRole } from '../teams/team-role';
import type { InvitationStatus } from './invitation.entity';

/** An invitation as the team's owners see it. */
export interface InvitationView {
  id: string;
  email: string;
  role: TeamRole;
  status: InvitationStatus;
  invitedBy: { id: string; displayName: string } | null;
  createdAt: string;
  lastSentAt: string;
  sendCount: number;
  expiresAt: string;
}

/** What the holder of an invitation link sees before accepting. */
export interface InvitationPreview {
  teamId: string;
  teamName: string;
  email: string;
  role: TeamRole;
  invitedByName: string | null;
  expiresAt: string;
  /** Whether the invited address already has an account (then: sign in to accept). */
  accountExists: boolean;
}
