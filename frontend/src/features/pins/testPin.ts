// Test helper (never imported by the app): a pin as the server answers it, with what a test cares about changed.
import type { PinView } from '@fieldbound/shared';

export function testPin(over: Partial<PinView> = {}): PinView {
  return {
    id: 'p1',
    mapId: 'm1',
    author: { id: 'u1', displayName: 'Ada' },
    geometry: { kind: 'point', at: { alpha: 100, fieldTesla: 10 } },
    title: 'Edge',
    body: '',
    status: 'open',
    category: null,
    version: 1,
    createdAt: '2026-12-02T03:00:00Z',
    updatedAt: '2026-12-02T03:00:00Z',
    resolvedAt: null,
    resolvedBy: null,
    replyCount: 0,
    ...over,
  };
}
