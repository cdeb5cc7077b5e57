// Shapes of the account, team and invitation answers of the API (backend/src/{auth,users,teams,invitations,audit}).

export type TeamRole = 'viewer' | 'editor' | 'owner';
export const TEAM_ROLES: TeamRole[] = ['viewer', 'editor', 'owner'];

export const ROLE_DESCRIPTIONS: Record<TeamRole, string> = {
  viewer: 'reads maps and pins, replies in threads',
  editor: 'also creates, edits and deletes maps and pins',
  owner: 'also manages members, invitations and the team',
};

export interface UserView {
  id: string;
  email: string;
  displayName: string;
  createdAt: string;
}

export interface SessionView {
  accessToken: string;
  accessTokenExpiresAt: string;
  user: UserView;
}

export interface MeView {
  user: UserView;
  teams: { id: string; name: string; role: TeamRole }[];
}

export interface TeamView {
  id: string;
  name: string;
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

export type InvitationStatus = 'pending' | 'accepted' | 'revoked' | 'expired';

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

export interface SentInvitation {
  invitation: InvitationView;
  emailSent: boolean;
}

export interface InvitationPreview {
  teamId: string;
  teamName: string;
  email: string;
  role: TeamRole;
  invitedByName: string | null;
  expiresAt: string;
  accountExists: boolean;
}

export interface AuditEventView {
  id: string;
  action: string;
  actorId: string | null;
  actorEmail: string | null;
  targetUserId: string | null;
  targetEmail: string | null;
  details: Record<string, unknown> | null;
  createdAt: string;
}

export interface CapturedMessage {
  id: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  links: string[];
  receivedAt: string;
}
