// The answer shapes live in the shared package, so the client reads exactly what the server sends.
export type { InvitationView, InvitationPreview } from '@fieldbound/shared';
