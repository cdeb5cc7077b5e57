import { Navigate, Route, Routes } from 'react-router-dom';
import { AppShell } from './components/AppShell';
import { MapsPage } from './pages/MapsPage';
import { MapPage } from './pages/MapPage';
import { SharedMapPage } from './pages/SharedMapPage';
import { SignInPage } from './pages/SignInPage';
import { NotFoundPage } from './pages/NotFoundPage';

export function App() {
  return (
    <Routes>
      <Route element={<AppShell />}>
        <Route index element={<Navigate to="/maps" replace />} />
        <Route path="sign-in" element={<SignInPage />} />
        <Route path="maps" element={<MapsPage />} />
        <Route path="maps/:mapId" element={<MapPage />} />
        <Route path="view/:token" element={<SharedMapPage />} />
        <Route path="*" element={<NotFoundPage />} />
      </Route>
    </Routes>
  );
}
