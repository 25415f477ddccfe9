// A printed report PDF stored under the digest of its HTML, so an unchanged report is not reprinted.
import { Column, CreateDateColumn, Entity, PrimaryColumn } from 'typeorm';

@Entity({ name: 'report_pdfs' })
export class ReportPdf {
  @PrimaryColumn({ type: 'text' })
  digest!: string;

  @Column({ type: 'bytea' })
  pdf!: Buffer;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt!: Date;
}
