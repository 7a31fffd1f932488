import { Badge } from '../../../components/badge';
import { useHealth } from '../api/get-health';

/** A quiet line telling whether the portal and its database are answering. */
export function ServiceStatus() {
  const { data, isPending, isError, refetch, isFetching } = useHealth();
  let tone = 'bg-nodata-100 text-nodata-700';
  let label = 'Checking the service…';
  let dot = 'bg-nodata-700 animate-pulse';
  if (!isPending && !isError && data.db === 'ok') {
    tone = 'bg-healthy-100 text-healthy-700';
    label = 'All systems running';
    dot = 'bg-healthy-700';
  } else if (isError || data?.db === 'down') {
    tone = 'bg-alert-100 text-alert-700';
    label = 'The service is not answering right now';
    dot = 'bg-alert-700';
  }
  return (
    <div role="status" aria-live="polite" className="inline-flex">
      <Badge tone={tone} mark={<span className={`h-2.5 w-2.5 rounded-full ${dot}`} />}>
        <span data-testid="service-status">{label}</span>
        {(isError || data?.db === 'down') && (
          <button
            type="button"
            onClick={() => void refetch()}
            disabled={isFetching}
            className="ml-1.5 rounded-full border border-current px-3 py-0.5 text-xs font-bold"
          >
            {isFetching ? 'Trying…' : 'Try again'}
          </button>
        )}
      </Badge>
    </div>
  );
}
