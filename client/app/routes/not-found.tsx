import { Link, useLocation } from "react-router-dom";
import { paths } from "../../lib/paths.ts";

export function Component() {
  const { pathname } = useLocation();
  return (
    <div>
      <h1 className="text-2xl mb-3">No page at {pathname}</h1>
      <Link to={paths.home()}>Back to the overview</Link>
    </div>
  );
}
