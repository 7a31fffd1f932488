import { Link, useParams } from 'react-router';
import { VisitReportEditor } from '../../features/visits/components/report-editor';

/** The report screen a technician opens from the schedule; its own header carries the tank's name. */
export function VisitReportRoute() {
  const { visitId = '' } = useParams();
  return (
    <div className="mx-auto max-w-3xl px-4 pb-10 pt-2 sm:pt-6">
      <Link to="/console/schedule" className="inline-flex min-h-11 items-center font-bold text-brine-700">
        ← Schedule
      </Link>
      <VisitReportEditor visitId={visitId} />
    </div>
  );
}
