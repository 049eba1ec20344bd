/**
 * The notebook examples of server/http/tokens/README.md ("Notebooks"), filled with this lab's
 * address and the server the page was loaded from, so they run as shown once the token is in
 * the `LAGBOOK_TOKEN` environment variable.
 */

/** Base URL of a lab's read API, e.g. `https://lagbook.example/api/v1/labs/fernhollow`. */
export function labApiBase(origin: string, slug: string): string {
  return `${origin.replace(/\/+$/, '')}/api/v1/labs/${encodeURIComponent(slug)}`;
}

/** Python, standard library only: list the channels, read one channel's readings and diagnostics. */
export function pythonNotebookSnippet(origin: string, slug: string, channelKey = 'air_t'): string {
  return [
    'import csv, io, json, os, urllib.request',
    '',
    `BASE = ${JSON.stringify(labApiBase(origin, slug))}`,
    'HEADERS = {"Authorization": "Bearer " + os.environ["LAGBOOK_TOKEN"]}',
    '',
    'def get(path):',
    '    with urllib.request.urlopen(urllib.request.Request(BASE + path, headers=HEADERS)) as res:',
    '        return res.read().decode("utf-8")',
    '',
    `channel = next(c for c in json.loads(get("/channels"))["channels"] if c["key"] == ${JSON.stringify(channelKey)})`,
    `readings = list(csv.DictReader(io.StringIO(get(f"/channels/{channel['id']}/readings.csv"))))  # last 7 days`,
    'diag = json.loads(get(f"/channels/{channel[\'id\']}/diagnostics?maxLag=48&decomposition=stl"))',
    'print(diag["identification"]["verdict"], diag["identification"]["explanation"])',
  ].join('\n');
}

/** R, base only: one channel's readings (its id in `LAGBOOK_CHANNEL`) and their ACF. */
export function rNotebookSnippet(origin: string, slug: string): string {
  return [
    `base <- ${JSON.stringify(labApiBase(origin, slug))}`,
    'auth <- c(Authorization = paste("Bearer", Sys.getenv("LAGBOOK_TOKEN")))',
    'readings <- read.csv(url(paste0(base, "/channels/", Sys.getenv("LAGBOOK_CHANNEL"), "/readings.csv"), headers = auth))',
    'acf(readings$value)',
  ].join('\n');
}
