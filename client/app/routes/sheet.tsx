import { useParams } from "react-router-dom";
import { RequireAuth } from "../../features/auth/components/require-auth.tsx";
import { SheetManager } from "../../features/sheets/components/sheet-manager.tsx";

/** One of your sheets. */
export function Component() {
  const { id } = useParams();
  const sheetId = Number(id);
  return (
    <RequireAuth role="analyst">
      {Number.isInteger(sheetId) && sheetId > 0 ? <SheetManager key={sheetId} id={sheetId} /> : <p className="text-brick">“{id}” is not a sheet number.</p>}
    </RequireAuth>
  );
}
