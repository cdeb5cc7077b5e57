import { ExplorerPage } from '../features/explorer/ExplorerPage';

/**
 * A map: the explorer. Loading and saving the map's setup on the server plug into ExplorerPage's
 * `initialSetup` and `onSaveSetup` (saved maps are a separate feature); until then it opens the default setup.
 */
export function MapPage() {
  return <ExplorerPage />;
}
