import { Column, CreateDateColumn, Entity, PrimaryGeneratedColumn, UpdateDateColumn } from 'typeorm';
import type { SensorFormat } from '../../shared/kit-presets';

// One table per kind of kit; every row belongs to one studio (ON DELETE CASCADE in the migration).
abstract class KitItem {
  @PrimaryGeneratedColumn('uuid') id: string;
  @Column({ name: 'studio_id', type: 'uuid' }) studioId: string;
  @Column({ type: 'text' }) name: string;
  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' }) createdAt: Date;
  @UpdateDateColumn({ name: 'updated_at', type: 'timestamptz' }) updatedAt: Date;
}

@Entity({ name: 'kit_bodies' })
export class KitBody extends KitItem {
  @Column({ name: 'sensor_format', type: 'text' }) sensorFormat: SensorFormat;
  @Column({ name: 'sensor_width_mm', type: 'double precision' }) sensorWidthMm: number;
  @Column({ name: 'sensor_height_mm', type: 'double precision' }) sensorHeightMm: number;
  @Column({ name: 'pixels_across', type: 'integer' }) pixelsAcross: number;
}

@Entity({ name: 'kit_lenses' })
export class KitLens extends KitItem {
  @Column({ name: 'focal_length_mm', type: 'double precision' }) focalLengthMm: number;
  @Column({ name: 'widest_f_number', type: 'double precision' }) widestFNumber: number;
  @Column({ name: 'narrowest_f_number', type: 'double precision' }) narrowestFNumber: number;
  @Column({ name: 'max_magnification', type: 'double precision' }) maxMagnification: number;
  @Column({ name: 'pupil_magnification', type: 'double precision' }) pupilMagnification: number;
}

@Entity({ name: 'kit_extension_sets' })
export class KitExtensionSet extends KitItem {
  @Column({ name: 'tube_lengths_mm', type: 'double precision', array: true }) tubeLengthsMm: number[];
}

@Entity({ name: 'kit_rails' })
export class KitRail extends KitItem {
  @Column({ name: 'travel_mm', type: 'double precision' }) travelMm: number;
  @Column({ name: 'smallest_step_um', type: 'double precision' }) smallestStepUm: number;
}
