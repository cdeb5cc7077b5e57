// Answers of the account, team, invitation, audit and local-mailbox routes (backend/src/{auth,users,
// teams,invitations,audit,mail}). One definition serves the server that sends them and the client that reads them.

/** Roles of a team membership, from least to most powerful. */
export const TEAM_ROLES = ['viewer', 'editor', 'owner'] as const;
export type TeamRole = (typeof TEAM_ROLES)[number];

/** A user as the API shows them to themselves. */
export interface UserView {
  id: string;
  email: string;
  displayName: string;
  createdAt: string;
}

/** `POST /api/auth/sign-in`, `register`, `refresh`. */
export interface SessionView {
  accessToken: string;
  /** ISO time after which the access token is refused; refresh a little before it. */
  accessTokenExpiresAt: string;
  user: UserView;
}

/** `GET /api/users/me` */
export interface MeView {
  user: UserView;
  teams: { id: string; name: string; role: TeamRole }[];
}

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

export type InvitationStatus = 'pending' | 'accepted' | 'revoked' | 'expired';

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
  /** `pending`: the e-mail could not be delivered yet; the server re-sends it by itself (backoff 30 s … 1 h). */
  mailStatus: 'sent' | 'pending';
  /** Failed deliveries since the last one that went out. */
  mailAttempts: number;
  /** When the server tries again (pending only). */
  nextMailAttemptAt: string | null;
}

/** `POST /api/teams/:teamId/invitations` and re-send: the invitation, and whether its e-mail went out (else it is pending and re-sent). */
export interface SentInvitation {
  invitation: InvitationView;
  emailSent: boolean;
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

/** One entry of a team's activity log (`action` is one of the server's audit actions). */
export interface AuditEventView<Action extends string = string> {
  id: string;
  action: Action;
  actorId: string | null;
  actorEmail: string | null;
  targetUserId: string | null;
  targetEmail: string | null;
  details: Record<string, unknown> | null;
  createdAt: string;
}

/** A message as the local mail fake received it over SMTP (`GET /api/dev/mailbox`). */
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
