import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { ApertureSweep, PlanInput, StackPlan } from '../../shared/schemas/plan-input';
import type { FocusingMethod, PlanKit } from '../../shared/schemas/plan';

/**
 * A saved stack plan. `result` and `sweep` are always computed by the server from `inputs`;
 * magnification, frames and step are copied out of `result` so the list can sort without JSON.
 */
@Entity({ name: 'plans' })
export class Plan {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'studio_id', type: 'uuid' }) studioId: string;
  @Column({ type: 'text' }) name: string;
  @Column({ type: 'text' }) notes: string;
  @Column({ type: 'jsonb' }) inputs: PlanInput;
  @Column({ type: 'jsonb' }) kit: PlanKit;
  @Column({ name: 'focusing_method', type: 'text' }) focusingMethod: FocusingMethod;
  @Column({ type: 'jsonb' }) result: StackPlan;
  @Column({ type: 'jsonb' }) sweep: ApertureSweep;
  @Column({ type: 'double precision' }) magnification: number;
  @Column({ type: 'double precision' }) frames: number;
  @Column({ name: 'step_mm', type: 'double precision', nullable: true }) stepMm: number | null;
  /** Sessions are added later; the link is a plain column until then. */
  @Column({ name: 'session_id', type: 'uuid', nullable: true }) sessionId: string | null;
  @Column({ name: 'created_by', type: 'uuid', nullable: true }) createdBy: string | null;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}
