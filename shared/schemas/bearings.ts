/**
 * Request and response shapes of the shop's bearing table (GET/POST/PUT/DELETE /api/bearings).
 * Ranges follow the drive document's (README, Drive documents): 5–30 balls, ball 1–40 mm and smaller than the
 * pitch diameter, contact angle 0–45°. The client's form and the server's validate() share them.
 */
import { z } from 'zod';
import { normaliseDesignation } from '../drive/bearing-table';
import { codePoints, nameSchema } from './names';

/** Where a row's geometry comes from: a source states it, it was measured on a part, or it is typical. */
export const BEARING_SOURCES = ['published', 'measured', 'estimated'] as const;
/** Validates a bearing source. */
export const BearingSourceSchema = z.enum(BEARING_SOURCES);
/** One of `published`, `measured`, `estimated`. */
export type BearingSource = z.infer<typeof BearingSourceSchema>;

/** A new or edited BearingType row. */
export const BearingTypeInputSchema = z
  .object({
    // Checked on the stored form: the designation and its upper-cased key (ß upper-cases to SS) fit 40 characters.
    designation: nameSchema('The designation', 40)
      .refine((d) => codePoints(normaliseDesignation(d)) <= 40, { message: 'The designation can be at most 40 characters' }),
    balls: z.number({ message: 'Enter the number of balls' }).int({ message: 'Balls must be a whole number' })
      .min(5, { message: 'Balls must be between 5 and 30' }).max(30, { message: 'Balls must be between 5 and 30' }),
    ballMm: z.number({ message: 'Enter the ball diameter in mm' }).min(1, { message: 'Ball diameter must be 1–40 mm' })
      .max(40, { message: 'Ball diameter must be 1–40 mm' }),
    pitchMm: z.number({ message: 'Enter the pitch diameter in mm' }).positive({ message: 'Pitch diameter must be positive' })
      .max(400, { message: 'Pitch diameter must be at most 400 mm' }),
    contactDeg: z.number({ message: 'Enter the contact angle in degrees' }).min(0, { message: 'Contact angle must be 0–45°' })
      .max(45, { message: 'Contact angle must be 0–45°' }).default(0),
    source: BearingSourceSchema.default('measured'),
    notes: z.string().trim().max(500, { message: 'Use at most 500 characters' }).default(''),
  })
  .refine((b) => b.ballMm < b.pitchMm, { path: ['ballMm'], message: 'Ball diameter must be smaller than the pitch diameter' });
/** A validated BearingType input. */
export type BearingTypeInput = z.infer<typeof BearingTypeInputSchema>;

/** A BearingType as the API returns it, with its defect factors (inner ring turning) and use count. */
export interface BearingTypeDto {
  id: number;
  designation: string;
  balls: number;
  ballMm: number;
  pitchMm: number;
  contactDeg: number;
  source: BearingSource;
  notes: string;
  /** FTF, BPFO, BPFI, BSF as multiples of the inner ring's speed (outer ring fixed). */
  factors: { ftf: number; bpfo: number; bpfi: number; bsf: number };
  /** Components of this shop's engines that name this designation. */
  usedBy: number;
  updatedAt: string;
}

/** GET /api/bearings. */
export interface BearingListResponse {
  items: BearingTypeDto[];
}
