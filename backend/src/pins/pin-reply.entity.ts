import crypto from 'node:crypto';
import { Entity, Index, ManyToOne, type Opt, PrimaryKey, Property } from '@mikro-orm/core';
import { User } from '../users/user.entity';
import { Pin } from './pin.entity';

/** One reply in a pin's thread (plain text). */
@Entity({ tableName: 'pin_replies' })
@Index({ name: 'pin_replies_pin_index', properties: ['pin', 'createdAt'] })
export class PinReply {
  @PrimaryKey({ type: 'uuid' })
  id: string = crypto.randomUUID();

  @ManyToOne(() => Pin, { deleteRule: 'cascade' })
  pin: Pin;

  @ManyToOne(() => User, { nullable: true, deleteRule: 'set null' })
  author: User | null;

  @Property({ type: 'text' })
  body: string;

  @Property({ type: 'datetime' })
  createdAt: Date & Opt = new Date();

  constructor(pin: Pin, author: User, body: string, now: Date) {
    this.pin = pin;
    this.author = author;
    this.body = body;
    this.createdAt = now;
  }
}
