export function App() {
  return <main><h1>Torquewise</h1></main>;
}
