import { Entity, OneToOne, type Opt, Property } from '@mikro-orm/core';
import { SavedMap } from './map.entity';

/** The PNG a client rendered of a map; the bytes are lazy so lists never load them. */
@Entity({ tableName: 'map_thumbnails' })
export class MapThumbnail {
  @OneToOne(() => SavedMap, (map) => map.thumbnail, { primary: true, owner: true, deleteRule: 'cascade', fieldName: 'map_id' })
  map: SavedMap;

  @Property({ type: 'blob', lazy: true })
  png: Buffer;

  @Property({ type: 'integer' })
  byteSize: number;

  @Property({ type: 'datetime' })
  updatedAt: Date & Opt = new Date();

  constructor(map: SavedMap, png: Buffer, now: Date) {
    this.map = map;
    this.png = png;
    this.byteSize = png.length;
    this.updatedAt = now;
  }
}
