import { Navigate, Route, Routes } from 'react-router-dom';
import { AppShell } from './components/AppShell';
import { RequireAuth } from './components/RequireAuth';
import { RequireTeam } from './components/RequireTeam';
import { MapsPage } from './pages/MapsPage';
import { MapPage } from './pages/MapPage';
import { SharedMapPage } from './pages/SharedMapPage';
import { SignInPage } from './pages/SignInPage';
import { SignUpPage } from './pages/SignUpPage';
import { ForgotPasswordPage } from './pages/ForgotPasswordPage';
import { ResetPasswordPage } from './pages/ResetPasswordPage';
import { InvitationPage } from './pages/InvitationPage';
import { TeamPage } from './pages/TeamPage';
import { ProfilePage } from './pages/ProfilePage';
import { SpeciesPage } from './pages/SpeciesPage';
import { MailboxPage } from './pages/MailboxPage';
import { NotFoundPage } from './pages/NotFoundPage';
import { MapLecturePage, SharedLecturePage } from './pages/LecturePages';

export function App() {
  return (
    <Routes>
      {/* Lecture view: full screen, outside the app's top bar. */}
      <Route path="view/:token/present" element={<SharedLecturePage />} />
      <Route element={<RequireAuth />}>
        <Route path="maps/:mapId/present" element={<MapLecturePage />} />
      </Route>
      <Route element={<AppShell />}>
        {/* Public: anyone may open these. */}
        <Route path="sign-in" element={<SignInPage />} />
        <Route path="sign-up" element={<SignUpPage />} />
        <Route path="forgot-password" element={<ForgotPasswordPage />} />
        <Route path="reset-password/:token" element={<ResetPasswordPage />} />
        <Route path="invitations/:token" element={<InvitationPage />} />
        <Route path="view/:token" element={<SharedMapPage />} />
        <Route path="dev/mailbox" element={<MailboxPage />} />
        {/* Signed in: others are sent to /sign-in?next=… and brought back. */}
        <Route element={<RequireAuth />}>
          <Route path="profile" element={<ProfilePage />} />
          {/* In a team: people in none are offered to start one. */}
          <Route element={<RequireTeam />}>
            <Route index element={<Navigate to="/maps" replace />} />
            <Route path="maps" element={<MapsPage />} />
            <Route path="maps/:mapId" element={<MapPage />} />
            <Route path="species" element={<SpeciesPage />} />
            <Route path="team" element={<TeamPage />} />
          </Route>
        </Route>
        <Route path="*" element={<NotFoundPage />} />
      </Route>
    </Routes>
  );
}
