import type { QueryClient } from "@tanstack/react-query";
import { createBrowserRouter } from "react-router-dom";
import { Layout } from "./layout.tsx";
import { RouteErrorPage } from "./route-error.tsx";

/** Route modules load lazily; each exports Component (and, when it needs data, a loader factory). */
export function createAppRouter(_queryClient: QueryClient) {
  return createBrowserRouter([
    {
      element: <Layout />,
      errorElement: <RouteErrorPage />,
      children: [
        { index: true, lazy: () => import("./routes/home.tsx") },
        { path: "*", lazy: () => import("./routes/not-found.tsx") },
      ],
    },
  ]);
}
