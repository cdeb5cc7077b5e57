import { lazy, Suspense, type ReactNode } from 'react';
import { Navigate, Route, Routes } from 'react-router-dom';
import { Spin } from 'antd';
import { AppShell } from './components/AppShell';
import { RequireAuth } from './components/RequireAuth';
import { RequireTeam } from './components/RequireTeam';

// Each page is its own chunk, loaded when its route is first opened: a first visit evaluates only the shell and
// the page it opens (the map page does not parse the species, team or sign-in pages' code).
const MapsPage = lazy(() => import('./pages/MapsPage').then((m) => ({ default: m.MapsPage })));
const MapPage = lazy(() => import('./pages/MapPage').then((m) => ({ default: m.MapPage })));
const SharedMapPage = lazy(() => import('./pages/SharedMapPage').then((m) => ({ default: m.SharedMapPage })));
const SignInPage = lazy(() => import('./pages/SignInPage').then((m) => ({ default: m.SignInPage })));
const SignUpPage = lazy(() => import('./pages/SignUpPage').then((m) => ({ default: m.SignUpPage })));
const ForgotPasswordPage = lazy(() => import('./pages/ForgotPasswordPage').then((m) => ({ default: m.ForgotPasswordPage })));
const ResetPasswordPage = lazy(() => import('./pages/ResetPasswordPage').then((m) => ({ default: m.ResetPasswordPage })));
const InvitationPage = lazy(() => import('./pages/InvitationPage').then((m) => ({ default: m.InvitationPage })));
const TeamPage = lazy(() => import('./pages/TeamPage').then((m) => ({ default: m.TeamPage })));
const ProfilePage = lazy(() => import('./pages/ProfilePage').then((m) => ({ default: m.ProfilePage })));
const SpeciesPage = lazy(() => import('./pages/SpeciesPage').then((m) => ({ default: m.SpeciesPage })));
const MailboxPage = lazy(() => import('./pages/MailboxPage').then((m) => ({ default: m.MailboxPage })));
const NotFoundPage = lazy(() => import('./pages/NotFoundPage').then((m) => ({ default: m.NotFoundPage })));
const MapLecturePage = lazy(() => import('./pages/LecturePages').then((m) => ({ default: m.MapLecturePage })));
const SharedLecturePage = lazy(() => import('./pages/LecturePages').then((m) => ({ default: m.SharedLecturePage })));

function PageLoading() {
  return (
    <div style={{ margin: 'auto', padding: 48 }}>
      <Spin size="large" />
    </div>
  );
}

/** A lazily loaded page with a quiet spinner while its code arrives. */
function page(element: ReactNode) {
  return <Suspense fallback={<PageLoading />}>{element}</Suspense>;
}

export function App() {
  return (
    <Routes>
      {/* Lecture view: full screen, outside the app's top bar. */}
      <Route path="view/:token/present" element={page(<SharedLecturePage />)} />
      <Route element={<RequireAuth />}>
        <Route path="maps/:mapId/present" element={page(<MapLecturePage />)} />
      </Route>
      <Route element={<AppShell />}>
        {/* Public: anyone may open these. */}
        <Route path="sign-in" element={page(<SignInPage />)} />
        <Route path="sign-up" element={page(<SignUpPage />)} />
        <Route path="forgot-password" element={page(<ForgotPasswordPage />)} />
        <Route path="reset-password/:token" element={page(<ResetPasswordPage />)} />
        <Route path="invitations/:token" element={page(<InvitationPage />)} />
        <Route path="view/:token" element={page(<SharedMapPage />)} />
        <Route path="dev/mailbox" element={page(<MailboxPage />)} />
        {/* Signed in: others are sent to /sign-in?next=… and brought back. */}
        <Route element={<RequireAuth />}>
          <Route path="profile" element={page(<ProfilePage />)} />
          {/* In a team: people in none are offered to start one. */}
          <Route element={<RequireTeam />}>
            <Route index element={<Navigate to="/maps" replace />} />
            <Route path="maps" element={page(<MapsPage />)} />
            <Route path="maps/:mapId" element={page(<MapPage />)} />
            <Route path="species" element={page(<SpeciesPage />)} />
            <Route path="team" element={page(<TeamPage />)} />
          </Route>
        </Route>
        <Route path="*" element={page(<NotFoundPage />)} />
      </Route>
    </Routes>
  );
}
