import type { LineStage } from '@/lib/production/stages';

/** One mask as a card on the board: plain data, handed from the page to the client components. */
export type BoardCard = {
  id: string;
  stage: LineStage;
  /** "Line 2 of DM-1042" */
  label: string;
  orderNumber: string;
  designName: string;
  finishName: string;
  buyerName: string;
  batchName: string;
  shipBy: string;
  late: boolean;
  oversoldOpen: boolean;
};
