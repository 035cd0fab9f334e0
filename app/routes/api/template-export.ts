// Placeholder until export is built.
export function loader() {
  return Response.json({ error: "Not built yet." }, { status: 404 });
}
