import { useCallback } from 'react';
import { Spin } from 'antd';
import { useNavigate, useParams } from 'react-router-dom';
import { useLiveMap, useLiveSharedMap } from '../api/live';
import { useMap } from '../api/maps';
import { usePins } from '../api/pins';
import { useTeamSpecies } from '../api/species';
import { useSharedMap } from '../api/viewingLinks';
import { ProblemState } from '../components/ProblemState';
import { LectureView } from '../features/lecture/LectureView';
import { LinkRefused } from './SharedMapPage';

function Opening() {
  return (
    <div style={{ margin: 'auto', padding: 48 }}>
      <Spin tip="Opening the lecture view…" size="large">
        <div style={{ width: 200, height: 80 }} />
      </Spin>
    </div>
  );
}

/** `/maps/:mapId/present`: a team map in the lecture view, with its species overlay and its pins kept live. */
export function MapLecturePage() {
  const { mapId } = useParams();
  const navigate = useNavigate();
  const map = useMap(mapId);
  const pins = usePins(mapId);
  const species = useTeamSpecies(map.data?.teamId ?? null);
  useLiveMap(mapId, map.data?.version);
  const exit = useCallback(() => navigate(`/maps/${mapId}`), [navigate, mapId]);
  if (map.isLoading) return <Opening />;
  if (map.isError || !map.data) return <ProblemState error={map.error} what="this map" onRetry={() => map.refetch()} />;
  return <LectureView title={map.data.title} description={map.data.description} setup={map.data.setup} pins={pins.data ?? []} species={species.data} onExit={exit} />;
}

/** `/view/:token/present`: a viewing link in the lecture view (its species, and pins if the link shows them), no account needed. */
export function SharedLecturePage() {
  const { token } = useParams();
  const navigate = useNavigate();
  const shared = useSharedMap(token);
  useLiveSharedMap(token, shared.isSuccess);
  const exit = useCallback(() => navigate(`/view/${encodeURIComponent(token ?? '')}`), [navigate, token]);
  if (shared.isLoading) return <Opening />;
  if (shared.isError || !shared.data) return <LinkRefused error={shared.error} onRetry={() => shared.refetch()} />;
  return <LectureView title={shared.data.title} description={shared.data.description} setup={shared.data.setup} pins={shared.data.pins ?? []} species={shared.data.species} onExit={exit} />;
}
