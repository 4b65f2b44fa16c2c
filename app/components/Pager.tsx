// The pager under every server-paginated table: "12 builds · page 2 of 3", Previous, Next.
// The caller gives the link for a page, so filters and sorting in the URL are kept.
import { Link } from "react-router";

export function Pager({ total, noun, page, pages, linkTo, className = "" }: { total: number; noun: [string, string]; page: number; pages: number; linkTo: (page: number) => string; className?: string }) {
  return (
    <nav className={`flex items-center gap-3 text-sm ${className}`} aria-label="Pages">
      <span className="text-iron-400">
        {total} {total === 1 ? noun[0] : noun[1]} · page {page} of {pages}
      </span>
      {page > 1 ? <Link to={linkTo(page - 1)}>Previous</Link> : null}
      {page < pages ? <Link to={linkTo(page + 1)}>Next</Link> : null}
    </nav>
  );
}
