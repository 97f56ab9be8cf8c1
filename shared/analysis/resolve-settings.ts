import { type AnalysisSettings, type AnalysisSettingsInput, AnalysisSettingsSchema } from '../schemas/analysis-settings';
import { type DriveDocument } from '../drive/types';

/**
 * Settings for a run: explicit fields win; the drive document fills in cylinders and firing order
 * where they were not given (and the expected rpm from its idle rpm); everything else takes the schema's defaults. Throws a ZodError
 * naming the bad field.
 */
export function resolveSettings(given: AnalysisSettingsInput, drive?: DriveDocument | null): AnalysisSettings {
  const merged: AnalysisSettingsInput = { ...given };
  if (drive) {
    if (merged.cylinders === undefined) merged.cylinders = drive.cylinders;
    if (merged.firingOrder === undefined && merged.cylinders === drive.cylinders) merged.firingOrder = drive.firingOrder;
    if (merged.expectedRpm === undefined && drive.idleRpm !== undefined) merged.expectedRpm = drive.idleRpm;
  }
  return AnalysisSettingsSchema.parse(merged);
}
