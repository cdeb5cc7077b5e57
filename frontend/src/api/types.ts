// Shapes of the account, team and invitation answers of the API: defined once in the shared package.
import type { TeamRole } from '@fieldbound/shared';

export type {
  TeamRole,
  UserView,
  SessionView,
  MeView,
  TeamView,
  MemberView,
  InvitationStatus,
  InvitationView,
  InvitationPreview,
  SentInvitation,
  AuditEventView,
  CapturedMessage,
} from '@fieldbound/shared';

export const TEAM_ROLES: TeamRole[] = ['viewer', 'editor', 'owner'];

export const ROLE_DESCRIPTIONS: Record<TeamRole, string> = {
  viewer: 'reads maps and pins, replies in threads',
  editor: 'also creates, edits and deletes maps and pins',
  owner: 'also manages members, invitations and the team',
};
