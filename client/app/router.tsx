import type { QueryClient } from "@tanstack/react-query";
import { createBrowserRouter } from "react-router-dom";
import { AuthProvider } from "../features/auth/components/auth-context.tsx";
import { Layout } from "./layout.tsx";
import { RouteErrorPage } from "./route-error.tsx";

/** Route modules load lazily; each exports Component (and, when it needs data, a loader factory). */
export function createAppRouter(queryClient: QueryClient) {
  return createBrowserRouter([
    {
      element: (
        <AuthProvider>
          <Layout />
        </AuthProvider>
      ),
      errorElement: <RouteErrorPage />,
      children: [
        { index: true, lazy: () => import("./routes/home.tsx") },
        { path: "sign-in", lazy: () => import("./routes/sign-in.tsx") },
        { path: "forbidden", lazy: () => import("./routes/forbidden.tsx") },
        { path: "admin/people", lazy: () => import("./routes/admin-users.tsx") },
        { path: "account/tokens", lazy: () => import("./routes/api-tokens.tsx") },
        { path: "catalogue", lazy: () => import("./routes/catalogue.tsx").then((m) => ({ Component: m.Component, loader: m.loader(queryClient) })) },
        { path: "catalogue/:slug", lazy: () => import("./routes/theory.tsx").then((m) => ({ Component: m.Component, loader: m.loader(queryClient) })) },
        { path: "submit", lazy: () => import("./routes/submit.tsx") },
        { path: "submit/:id", lazy: () => import("./routes/submit.tsx") },
        { path: "my-submissions", lazy: () => import("./routes/my-submissions.tsx") },
        { path: "review", lazy: () => import("./routes/review-queue.tsx") },
        { path: "review/:id", lazy: () => import("./routes/review.tsx") },
        { path: "dev/outbox", lazy: () => import("./routes/outbox.tsx") },
        { path: "translate", lazy: () => import("./routes/translate.tsx") },
        { path: "forecast", lazy: () => import("./routes/forecast.tsx") },
        { path: "consistency", lazy: () => import("./routes/consistency.tsx") },
        { path: "sheets", lazy: () => import("./routes/sheets.tsx") },
        { path: "sheets/:id", lazy: () => import("./routes/sheet.tsx") },
        { path: "shared/:token", lazy: () => import("./routes/shared-sheet.tsx") },
        { path: "*", lazy: () => import("./routes/not-found.tsx") },
      ],
    },
  ]);
}
