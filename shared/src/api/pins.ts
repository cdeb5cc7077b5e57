import type { PersonRef } from './common.js';

/** Limits on pins and replies. */
export const PIN_LIMITS = {
  maxTitleLength: 200,
  maxBodyLength: 10_000,
  maxCategoryLength: 40,
  minPolygonVertices: 3,
  maxPolygonVertices: 200,
} as const;

/** A place on the map in physical units, so a pin stays put when axes, ranges or display units change. */
export interface PinPoint {
  /** Static dipole polarizability, a₀³. */
  alpha: number;
  /** Magnetic field, tesla. */
  fieldTesla: number;
}

export type PinGeometry =
  | { kind: 'point'; at: PinPoint }
  | { kind: 'rect'; min: PinPoint; max: PinPoint }
  | { kind: 'polygon'; vertices: PinPoint[] };

export const PIN_STATUSES = ['open', 'resolved'] as const;
export type PinStatus = (typeof PIN_STATUSES)[number];

export interface PinReplyView {
  id: string;
  author: PersonRef | null;
  body: string;
  createdAt: string;
}

export interface PinView {
  id: string;
  mapId: string;
  author: PersonRef | null;
  geometry: PinGeometry;
  title: string;
  /** Plain text; never interpreted as HTML. */
  body: string;
  status: PinStatus;
  category: string | null;
  version: number;
  createdAt: string;
  updatedAt: string;
  resolvedAt: string | null;
  resolvedBy: PersonRef | null;
  replyCount: number;
}

/** `GET /api/pins/:pinId`: the pin with its thread. */
export interface PinDetail extends PinView {
  replies: PinReplyView[];
}

/** `POST /api/maps/:mapId/pins` */
export interface CreatePinRequest {
  geometry: PinGeometry;
  title: string;
  body?: string;
  category?: string | null;
}

/** `PATCH /api/pins/:pinId`: stale `expectedVersion` → 409 with the current pin. */
export interface UpdatePinRequest {
  expectedVersion: number;
  geometry?: PinGeometry;
  title?: string;
  body?: string;
  category?: string | null;
  status?: PinStatus;
}

/** `POST /api/pins/:pinId/replies` */
export interface CreateReplyRequest {
  body: string;
}
