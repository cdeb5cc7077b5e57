import { createContext, type ReactNode, useCallback, useContext, useEffect, useMemo, useState } from 'react';
import { useMe } from '../api/auth';
import type { MeView } from '../api/types';

export const CURRENT_TEAM_STORAGE_KEY = 'fieldbound.currentTeamId';

type TeamSummary = MeView['teams'][number];

interface CurrentTeamState {
  /** The team the person is working in, or null when they belong to none. */
  team: TeamSummary | null;
  teams: TeamSummary[];
  selectTeam(teamId: string): void;
}

const CurrentTeamContext = createContext<CurrentTeamState>({ team: null, teams: [], selectTeam: () => undefined });

function readStored(): string | null {
  try {
    return localStorage.getItem(CURRENT_TEAM_STORAGE_KEY);
  } catch {
    return null;
  }
}

/**
 * The current team is app state, not part of the URL: kept in localStorage so it survives reloads
 * and new tabs, and falling back to the first team when the stored one is gone (left, deleted).
 */
export function CurrentTeamProvider({ children }: { children: ReactNode }) {
  const { data: me } = useMe();
  const [storedId, setStoredId] = useState<string | null>(readStored);
  const teams = useMemo(() => me?.teams ?? [], [me]);
  const team = teams.find((t) => t.id === storedId) ?? teams[0] ?? null;

  const selectTeam = useCallback((teamId: string) => {
    setStoredId(teamId);
    try {
      localStorage.setItem(CURRENT_TEAM_STORAGE_KEY, teamId);
    } catch {
      // Private mode: the choice lasts for this page only.
    }
  }, []);

  // Other tabs switching team do not pull this one along, but a reload picks up the last choice.
  useEffect(() => {
    if (team && team.id !== storedId) selectTeam(team.id);
  }, [team, storedId, selectTeam]);

  const value = useMemo(() => ({ team, teams, selectTeam }), [team, teams, selectTeam]);
  return <CurrentTeamContext.Provider value={value}>{children}</CurrentTeamContext.Provider>;
}

export function useCurrentTeam(): CurrentTeamState {
  return useContext(CurrentTeamContext);
}
