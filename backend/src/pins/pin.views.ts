import type { PinReplyView, PinView } from '@fieldbound/shared';
import { personRef } from '../maps/map.views';
import type { PinReply } from './pin-reply.entity';
import type { Pin } from './pin.entity';

export function toPinView(pin: Pin): PinView {
  return {
    id: pin.id,
    mapId: pin.map.id,
    author: personRef(pin.author),
    geometry: pin.geometry,
    title: pin.title,
    body: pin.body,
    status: pin.status,
    category: pin.category,
    version: pin.version,
    createdAt: pin.createdAt.toISOString(),
    updatedAt: pin.updatedAt.toISOString(),
    resolvedAt: pin.resolvedAt ? pin.resolvedAt.toISOString() : null,
    resolvedBy: personRef(pin.resolvedBy),
    replyCount: pin.replyCount ?? 0,
  };
}

export function toReplyView(reply: PinReply): PinReplyView {
  return { id: reply.id, author: personRef(reply.author), body: reply.body, createdAt: reply.createdAt.toISOString() };
}
