import { Column, Entity, PrimaryGeneratedColumn } from 'typeorm';

/** A message the in-process SMTP sink received (the development outbox). */
@Entity({ name: 'mail_messages' })
export class MailMessage {
  @PrimaryGeneratedColumn('increment', { name: 'id' })
  id: number;

  @Column('varchar', { name: 'from_address', length: 500 })
  from: string;

  @Column('varchar', { name: 'to_address', length: 2000 })
  to: string;

  @Column('varchar', { name: 'subject', length: 1000 })
  subject: string;

  @Column('text', { name: 'text_body' })
  text: string;

  @Column('text', { name: 'html_body', nullable: true })
  html: string | null;

  @Column('integer', { name: 'raw_size' })
  rawSize: number;

  @Column('datetime', { name: 'received_at' })
  receivedAt: Date;
}
