import { visitTaskLabels, type VisitReportContent } from '@shared/schemas/visits';

/** One plain line about what a visit did, for notifications, e-mails and list rows. */
export function reportSummary(report: VisitReportContent): string {
  const parts: string[] = [];
  if (report.waterChange) {
    parts.push(`Water change ${round(report.waterChange.percent)} % (${round(report.waterChange.litres)} L)`);
  }
  const other = report.tasksDone.filter((task) => task !== 'water-change');
  if (other.length > 0) {
    const first = visitTaskLabels[other[0]!];
    parts.push(
      other.length === 1 ? first : `${first} and ${other.length - 1} more task${other.length > 2 ? 's' : ''}`,
    );
  }
  if (report.readings.length > 0) {
    parts.push(`${report.readings.length} reading${report.readings.length === 1 ? '' : 's'} taken`);
  }
  if (report.livestockChanges.length > 0) {
    parts.push(
      `${report.livestockChanges.length} livestock change${report.livestockChanges.length === 1 ? '' : 's'}`,
    );
  }
  if (report.photos.length > 0)
    parts.push(`${report.photos.length} photo${report.photos.length === 1 ? '' : 's'}`);
  // One sentence: only its first part starts with a capital ("Water change …; added, moved …").
  const sentence = parts.map((part, index) =>
    index === 0 ? part : `${part.charAt(0).toLowerCase()}${part.slice(1)}`,
  );
  return sentence.length > 0 ? `${sentence.join('; ')}.` : '';
}

const round = (value: number) => Math.round(value * 10) / 10;
