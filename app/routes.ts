import { type RouteConfig, index, layout, prefix, route } from "@react-router/dev/routes";

export default [
  route("login", "routes/login.tsx"),
  route("logout", "routes/logout.ts"),
  route("invitation/:token", "routes/invitation.tsx"),
  route("dev/mail", "routes/dev-mail.tsx"),
  route("healthz", "routes/healthz.ts"),
  route("verify/:recordId", "routes/verify.tsx"),
  route("records/:recordId/pdf", "routes/records/pdf.ts"),
  route("records/:recordId/json", "routes/records/json.ts"),
  route("records/:recordId/photos/:photoId", "routes/records/photo.ts"),
  ...prefix("api", [
    route("me", "routes/api/me.ts"),
    route("jobs", "routes/api/jobs.ts"),
    route("jobs/:jobId", "routes/api/job.ts"),
    route("templates/:key/:version", "routes/api/template.ts"),
    route("checklists/:checklistId", "routes/api/checklist.ts"),
    route("checklists/:checklistId/replies", "routes/api/comment-reply.ts"),
    route("templates/:key/:version/export", "routes/api/template-export.ts"),
    route("sync", "routes/api/sync.ts"),
    route("offline", "routes/api/offline.ts"),
    route("photos/:photoId", "routes/api/photo.ts"),
  ]),
  layout("routes/shell.tsx", [
    index("routes/today.tsx"),
    ...prefix("jobs", [
      index("routes/jobs/list.tsx"),
      route("new", "routes/jobs/new.tsx"),
      route(":jobId", "routes/jobs/detail.tsx"),
      route(":jobId/edit", "routes/jobs/edit.tsx"),
    ]),
    ...prefix("vessels", [
      index("routes/vessels/list.tsx"),
      route("new", "routes/vessels/new.tsx"),
      route(":vesselId", "routes/vessels/edit.tsx"),
    ]),
    route("checklists/:checklistId", "routes/checklists/view.tsx"),
    route("checklists/:checklistId/review", "routes/checklists/review.tsx"),
    route("sync", "routes/sync.tsx"),
    route("records/:recordId", "routes/records/view.tsx"),
    // calculators
    ...prefix("calculators", [
      index("routes/calculators/index.tsx"),
      route(":name", "routes/calculators/calculator.tsx"),
    ]),
    // library
    ...prefix("library", [
      index("routes/library/index.tsx"),
      route("import", "routes/library/import.tsx"),
      route(":key/compare", "routes/library/compare.tsx"),
      route(":key/:version", "routes/library/version.tsx"),
      route(":key/:version/edit", "routes/library/edit.tsx"),
    ]),
    // end library
    route("people", "routes/people.tsx"),
    route("account", "routes/account.tsx"),
    route("audit", "routes/audit.tsx"),
    route("yard", "routes/yard.tsx"),
  ]),
  route("*", "routes/not-found.tsx"),
] satisfies RouteConfig;
