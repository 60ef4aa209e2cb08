// Drawing problems in words; each one is also marked on the drawing where it occurs.
import type { DrawingIssue } from '../schematic/drawingChecks';

export function IssueList({ issues, onPick }: { issues: DrawingIssue[]; onPick: (issue: DrawingIssue) => void }) {
  if (issues.length === 0) return <p className="empty-note">No drawing problems found.</p>;
  return (
    <ul className="issue-list" aria-label="Drawing problems">
      {issues.map((iss, i) => (
        <li key={`${iss.code}-${i}`} className={iss.severity}>
          <button type="button" onClick={() => onPick(iss)} title="Show on the drawing">{iss.message}</button>
        </li>
      ))}
    </ul>
  );
}
