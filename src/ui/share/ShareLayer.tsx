/** What sharing adds to the app's frame: the shared-sheet banner and the print-only sheet. */
import { PrintSheet } from './PrintSheet';
import { VisitBanner } from './VisitBanner';

export function ShareLayer() {
  return (
    <>
      <VisitBanner />
      <PrintSheet />
    </>
  );
}
