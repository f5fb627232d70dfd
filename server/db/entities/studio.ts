import { Column, Entity, OneToMany, PrimaryGeneratedColumn } from 'typeorm';
import type { Membership } from './membership.js';

@Entity({ name: 'studios' })
export class Studio {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Column('varchar', { name: 'name', length: 120, unique: true })
  name: string;

  @Column('text', { name: 'description', default: '' })
  description: string;

  @Column('datetime', { name: 'created_at' })
  createdAt: Date;

  @OneToMany('Membership', (m: Membership) => m.studio)
  memberships: Membership[];
}
