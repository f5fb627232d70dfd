import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** One material of the maker space's catalogue; `sheetSizes` is JSON `[[w, h], …]` in mm. */
@Entity({ name: 'materials' })
export class Material {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Column('varchar', { name: 'name', length: 120, unique: true })
  name: string;

  @Column('real', { name: 'thickness' })
  thickness: number;

  @Column('real', { name: 'kerf' })
  kerf: number;

  @Column('real', { name: 'cutting_speed', nullable: true })
  cuttingSpeed: number | null;

  @Column('real', { name: 'density', nullable: true })
  density: number | null;

  @Column('text', { name: 'sheet_sizes' })
  sheetSizes: string;

  @Column('boolean', { name: 'prohibited', default: false })
  prohibited: boolean;

  @Column('text', { name: 'prohibited_reason', nullable: true })
  prohibitedReason: string | null;

  @Column('text', { name: 'notes', default: '' })
  notes: string;

  @Column('datetime', { name: 'created_at' })
  createdAt: Date;

  @Column('datetime', { name: 'updated_at' })
  updatedAt: Date;
}
