import { useParams } from 'react-router-dom';
import { EmptyPage } from '../components/EmptyPage';

export function MapPage() {
  const { mapId } = useParams();
  return (
    <EmptyPage title="Map">
      Map <code>{mapId}</code> opens here: the setup on the left, the polarizability–field map in the middle, the probe on the right.
    </EmptyPage>
  );
}
