import { AnalysisSettingsSchema } from '../../../shared/schemas/analysis-settings';
import { useQuery } from '@tanstack/react-query';
import { PageHeader } from '../../components/ui/page-header';
import { CapturePlannerForm } from '../../features/capture-planner/components/capture-planner-form';
import { shopSettingsQueryOptions } from '../../features/shop-setup/api/shop-settings-queries';
import { SafetyNote } from './safety-note';

/** Capture planner: how long to record, the scope setting and the sample rate, with the working; the full cautions. */
export function CapturePlannerRoute() {
  const { data } = useQuery(shopSettingsQueryOptions());
  const envelopeTopHz = data?.analysisDefaults.envelopeMaxHz ?? AnalysisSettingsSchema.parse({}).envelopeMaxHz;
  return (
    <>
      <PageHeader title="Capture planner" description="How long to record, how to set the scope and the sample rate, before you go to the car." />
      <div className="mb-6">
        <SafetyNote />
      </div>
      <CapturePlannerForm key={envelopeTopHz} envelopeTopHz={envelopeTopHz} />
    </>
  );
}
