// A photo uploaded for a site or one of its strips; the file lives outside the web root.
import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

@Entity({ name: 'attachments' })
@Index(['siteId'])
export class Attachment {
  @PrimaryGeneratedColumn('uuid')
  id!: string;

  @Column({ name: 'site_id', type: 'uuid' })
  siteId!: string;

  @Column({ name: 'strip_id', type: 'uuid', nullable: true })
  stripId!: string | null;

  @Column({ name: 'uploaded_by', type: 'uuid', nullable: true })
  uploadedBy!: string | null;

  /** Generated name inside the upload folder; never the user's file name. */
  @Column({ name: 'stored_name', type: 'text' })
  storedName!: string;

  /** Generated name of the small JPEG preview; null for photos stored before thumbnails. */
  @Column({ name: 'thumbnail_name', type: 'text', nullable: true })
  thumbnailName!: string | null;

  @Column({ name: 'original_name', type: 'text' })
  originalName!: string;

  @Column({ name: 'mime_type', type: 'text' })
  mimeType!: string;

  @Column({ name: 'size_bytes', type: 'integer' })
  sizeBytes!: number;

  @Column({ type: 'text', default: '' })
  caption!: string;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;
}
