import { matchReasonLabels } from '../../schemas/matching';
import type { FrameSummary } from '../../schemas/frames';

/** The frames list as a spreadsheet: one row per file on the card, a raw file beside its JPEG. */
export const frameCsvHeader = [
  'Card path',
  'Station',
  'Camera serial',
  'Folder',
  'Frame number',
  'Captured (camera clock)',
  'Person id',
  'Employee id',
  'Sitter',
  'Reason',
  'Placed by hand',
] as const;

export function frameCsvRow(frame: FrameSummary): string[] {
  return [
    frame.cardPath,
    frame.stationName,
    frame.cameraSerial ?? '',
    frame.dcfFolder === null ? '' : String(frame.dcfFolder),
    frame.dcfNumber === null ? '' : String(frame.dcfNumber).padStart(4, '0'),
    frame.capturedLocal ?? '',
    frame.personId ?? '',
    frame.employeeId ?? '',
    frame.sitterName ?? '',
    matchReasonLabels[frame.matchReason],
    frame.manual ? 'yes' : 'no',
  ];
}
