import { Link, useParams, useSearchParams } from 'react-router-dom';
import { paths } from '../paths';
import { PageHeader } from '../../components/ui/page-header';
import { postForm } from '../../lib/api-client';
import { RecordPanel } from '../../features/recording/components/record-panel';
import type { RecordingMetadata } from '../../features/recording/lib/recording-metadata';
import { SafetyNote } from './safety-note';

/**
 * Record into a case from the browser (issue 20 item 1). The upload goes through the capture
 * upload path of the case (`POST /api/cases/:id/captures`, multipart: `metadata` first, then the
 * file). The engine's cylinder count and idle rpm come from the URL (?cylinders=&idle=), which
 * the case page's "Record in the browser" link fills from the case's engine.
 */
export function RecordRoute() {
  const { caseId = '' } = useParams();
  const [query] = useSearchParams();
  const cylinders = Math.min(16, Math.max(1, Number(query.get('cylinders')) || 4));
  const idle = Number(query.get('idle')) || null;
  const upload = async (file: File, metadata: RecordingMetadata) => {
    const form = new FormData();
    // The contract reads the metadata before the files.
    form.append('metadata', JSON.stringify([metadata]));
    form.append('files', file);
    await postForm(`/api/cases/${encodeURIComponent(caseId)}/captures`, form);
  };
  return (
    <div className="space-y-6">
      <PageHeader title={`Record into case ${caseId}`} description={<>Record the reference and the pickup straight from a USB audio interface; the recording is uploaded like a file. <Link className="text-primary hover:underline" to={paths.case(caseId)}>← Back to the case</Link></>} />
      <SafetyNote />
      <RecordPanel engine={{ cylinders, idleRpm: idle }} onUpload={upload} />
    </div>
  );
}
