import { Button } from "@/components/ui";

export interface TablePagerProps {
  /** What the pages hold, e.g. "people": names the navigation landmark "Pages of people". */
  noun: string;
  pageIndex: number;
  pageCount: number;
  canPrevious: boolean;
  canNext: boolean;
  onPrevious: () => void;
  onNext: () => void;
}

/** Previous/next paging under a data table; renders nothing when everything fits on one page. */
export function TablePager({ noun, pageIndex, pageCount, canPrevious, canNext, onPrevious, onNext }: TablePagerProps) {
  if (pageCount <= 1) return null;
  return (
    <nav aria-label={`Pages of ${noun}`} className="flex flex-wrap items-center gap-3">
      <Button type="button" variant="outline" size="sm" onClick={onPrevious} disabled={!canPrevious}>
        Previous page
      </Button>
      <span>
        Page {pageIndex + 1} of {pageCount}
      </span>
      <Button type="button" variant="outline" size="sm" onClick={onNext} disabled={!canNext}>
        Next page
      </Button>
    </nav>
  );
}
