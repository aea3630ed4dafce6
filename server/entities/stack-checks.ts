import { Column, Entity, PrimaryColumn } from 'typeorm';
import type { CheckThresholds } from '../../shared/schemas/checks';
import type { StackCheckResults } from '../../shared/schemas/check-views';

/** The latest run of the checks on one stack (see migration 1733000006000). */
@Entity({ name: 'stack_checks' })
export class StackCheckRun {
  @PrimaryColumn({ name: 'stack_id', type: 'uuid' }) stackId: string;
  @Column({ name: 'stack_version', type: 'int' }) stackVersion: number;
  @Column({ name: 'input_key', type: 'text' }) inputKey: string;
  @Column({ type: 'jsonb' }) thresholds: CheckThresholds;
  @Column({ type: 'jsonb' }) results: StackCheckResults;
  @Column({ name: 'computed_at', type: 'timestamptz' }) computedAt: Date;
}

/** A studio's own limits; only the fields it set, the rest come from the defaults. */
@Entity({ name: 'studio_check_thresholds' })
export class StudioCheckThresholds {
  @PrimaryColumn({ name: 'studio_id', type: 'uuid' }) studioId: string;
  @Column({ type: 'jsonb' }) thresholds: Partial<CheckThresholds>;
  @Column({ name: 'updated_by', type: 'uuid', nullable: true }) updatedBy: string | null;
  @Column({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}
