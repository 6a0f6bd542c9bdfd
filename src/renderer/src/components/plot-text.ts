// Text from a project file (requirement labels, names) on its way to plotly. Plotly reads its text
// as a small markup language: <br>, <b>, <i>, <sup>, <sub>, <span style>, <a href> are tags, and
// &...; are entities; a hover template also fills in %{...}. A label is data, never markup: every
// character plotly would read as markup is written as an entity, which plotly shows as the
// character itself. Plotly decodes entities only in the text between tags, after it has found
// the tags, so an escaped "<a href>" is drawn as those characters and makes no link.

const ENTITIES: Record<string, string> = {
  '&': '&amp;',
  '<': '&lt;',
  '>': '&gt;',
  '"': '&#34;',
  "'": '&#39;',
  // %{x} in a hover template is a placeholder: a literal % never starts one
  '%': '&#37;',
};

/** A file's text as plotly plain text (for trace names, text labels, titles, annotations and hover templates). */
export function plotText(text: string): string {
  return text.replace(/[&<>"'%]/g, (c) => ENTITIES[c]!);
}
