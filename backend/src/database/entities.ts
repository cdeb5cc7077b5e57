// Every entity the ORM knows, listed explicitly so discovery works the same compiled and under Vitest.
import { AuditEvent } from '../audit/audit-event.entity';
import { PasswordResetToken } from '../auth/password-reset-token.entity';
import { RefreshToken } from '../auth/refresh-token.entity';
import { Invitation } from '../invitations/invitation.entity';
import { Membership } from '../teams/membership.entity';
import { Team } from '../teams/team.entity';
import { User } from '../users/user.entity';
import { SavedMap } from '../maps/map.entity';
import { MapVersion } from '../maps/map-version.entity';
import { MapResultSummary } from '../maps/map-result-summary.entity';
import { MapThumbnail } from '../maps/map-thumbnail.entity';
import { CatalogueSpecies } from '../species/catalogue-species.entity';
import { SpeciesList } from '../species/species-list.entity';
import { TeamSpecies } from '../species/team-species.entity';
import { Pin } from '../pins/pin.entity';
import { PinReply } from '../pins/pin-reply.entity';
import { ViewingLink } from '../viewing-links/viewing-link.entity';
import { MapEvent } from '../live/map-event.entity';
import { RateLimitHit } from '../rate-limit/rate-limit-hit.entity';

export const ALL_ENTITIES = [User, RefreshToken, PasswordResetToken, Team, Membership, Invitation, AuditEvent,
  SavedMap, MapVersion, MapResultSummary, MapThumbnail, CatalogueSpecies, SpeciesList, TeamSpecies, Pin, PinReply, ViewingLink,
  MapEvent, RateLimitHit,
] as const;
