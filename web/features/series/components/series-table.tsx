// The series report's figures tables (a caption saying what the numbers are, a scroll box) and
// its sections.
import type { ReactNode } from 'react';
import { DataTable } from '../../../components/ui/data-table';
import { PageSection } from '../../../components/ui/page-section';

/** A figures table of the series report, its caption above the scrolling box. */
export function SeriesTable(props: { caption: string; head: ReactNode[]; rows: ReactNode[][] }) {
  return <DataTable {...props} captionAbove />;
}

/** A section of the series report. */
export const SeriesSection = PageSection;
