// Placeholder until this screen is built.
export default function Placeholder() {
  return <p>Coming soon.</p>;
}
