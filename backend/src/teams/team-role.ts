/**
 * Roles of a team membership, from least to most powerful:
 * - viewer: reads the team's maps and pins, replies in pin threads;
 * - editor: also creates, edits and deletes maps and pins;
 * - owner:  also manages members, roles, invitations and the team itself.
 */
export const TEAM_ROLES = ['viewer', 'editor', 'owner'] as const;
export type TeamRole = (typeof TEAM_ROLES)[number];

const RANK: Record<TeamRole, number> = { viewer: 1, editor: 2, owner: 3 };

/** True when `role` grants at least what `minimum` grants. */
export function roleAtLeast(role: TeamRole, minimum: TeamRole): boolean {
  return RANK[role] >= RANK[minimum];
}
