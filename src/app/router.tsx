import { createBrowserRouter, Navigate, redirect, type RouteObject } from "react-router-dom";
import type { QueryClient } from "@tanstack/react-query";
import { FullPageSpinner } from "@/components/ui/spinner";
import { paths } from "@/config/paths";
import { RoleGate } from "@/app/role-gate";
import { AppLayout, protectedLoader } from "@/app/routes/app-layout";
import { NotFoundRoute } from "@/app/routes/not-found";
import { RootLayout } from "@/app/routes/root";
import { RouteError } from "@/app/routes/route-error";
import { SignInRoute, signInLoader } from "@/app/routes/sign-in";

/**
 * The route tree. Sign-in and the shell load with the first screen; every signed-in screen is
 * its own chunk. The session is checked once, in the signed-in layout's loader, before any child
 * loader's data is used; role checks wrap the screens a role may not open.
 */
export function createAppRoutes(qc: QueryClient): RouteObject[] {
  return [
    {
      id: "root",
      element: <RootLayout />,
      errorElement: <RouteError />,
      hydrateFallbackElement: <FullPageSpinner />,
      children: [
        { path: paths.signIn, loader: signInLoader(qc), element: <SignInRoute /> },
        // public pages: no session loader
        {
          path: paths.forgotPassword,
          lazy: () => import("@/app/routes/password-reset").then((m) => ({ Component: m.ForgotPasswordRoute })),
        },
        {
          path: paths.resetPassword,
          lazy: () => import("@/app/routes/password-reset").then((m) => ({ Component: m.ResetPasswordRoute })),
        },
        {
          path: "/p/:token",
          lazy: () => import("@/app/routes/proposal-public").then((m) => ({ Component: m.ProposalPublicRoute })),
        },
        {
          id: "app",
          loader: protectedLoader(qc),
          element: <AppLayout />,
          children: [
            {
              // errors below render inside the shell
              errorElement: <RouteError />,
              children: [
                { index: true, loader: () => redirect(paths.jobs), element: <Navigate to={paths.jobs} replace /> },
                {
                  path: paths.jobs,
                  lazy: () => import("@/app/routes/jobs").then((m) => ({ Component: m.JobsRoute })),
                },
                {
                  path: "/jobs/:jobId/packet",
                  lazy: () => import("@/app/routes/install-packet").then((m) => ({ Component: m.InstallPacketRoute })),
                },
                {
                  path: "/jobs/:jobId/:section?",
                  lazy: () => import("@/app/routes/jobs/job-workspace").then((m) => ({ Component: m.JobWorkspaceRoute })),
                },
                {
                  element: <RoleGate screen="customers" name="Customers" />,
                  children: [
                    {
                      path: paths.customers,
                      lazy: () => import("@/app/routes/customers").then((m) => ({ Component: m.CustomersRoute })),
                    },
                  ],
                },
                {
                  element: <RoleGate screen="company" name="The company profile" />,
                  children: [
                    {
                      path: paths.company,
                      lazy: () => import("@/app/routes/company").then((m) => ({ Component: m.CompanyRoute })),
                    },
                  ],
                },
                {
                  element: <RoleGate screen="approvals" name="Approvals" />,
                  children: [
                    {
                      path: paths.approvals,
                      lazy: () => import("@/app/routes/approvals").then((m) => ({ Component: m.ApprovalsRoute })),
                    },
                    {
                      path: `${paths.approvals}/:quoteId`,
                      lazy: () => import("@/app/routes/approvals").then((m) => ({ Component: m.ApprovalReviewRoute })),
                    },
                  ],
                },
                {
                  element: <RoleGate screen="priceBook" name="The price book" />,
                  children: [
                    {
                      path: paths.priceBook,
                      lazy: () => import("@/app/routes/price-book").then((m) => ({ Component: m.PriceBookRoute })),
                    },
                  ],
                },
                {
                  element: <RoleGate screen="team" name="Team" />,
                  children: [
                    {
                      path: paths.team,
                      lazy: () =>
                        import("@/app/routes/team").then((m) => ({ Component: m.TeamRoute, loader: m.teamLoader(qc) })),
                    },
                  ],
                },
                {
                  element: <RoleGate screen="devMail" name="The test inbox" />,
                  children: [
                    {
                      path: paths.devMail,
                      lazy: () => import("@/app/routes/dev-mail").then((m) => ({ Component: m.DevMailRoute })),
                    },
                  ],
                },
                {
                  path: paths.account,
                  lazy: () => import("@/app/routes/account").then((m) => ({ Component: m.AccountRoute })),
                },
                { path: "*", element: <NotFoundRoute /> },
              ],
            },
          ],
        },
      ],
    },
  ];
}

export const createAppRouter = (qc: QueryClient) => createBrowserRouter(createAppRoutes(qc));
