// Every entity the ORM knows, listed explicitly so discovery works the same compiled and under Vitest.
import { AuditEvent } from '../audit/audit-event.entity';
import { PasswordResetToken } from '../auth/password-reset-token.entity';
import { RefreshToken } from '../auth/refresh-token.entity';
import { Invitation } from '../invitations/invitation.entity';
import { Membership } from '../teams/membership.entity';
import { Team } from '../teams/team.entity';
import { User } from '../users/user.entity';

export const ALL_ENTITIES = [User, RefreshToken, PasswordResetToken, Team, Membership, Invitation, AuditEvent] as const;
