"""Results of a run: the trials, the ranked table, the verdict per series,
the warnings, and every report the command line writes."""
import json
import os

from . import _engine

try:
    import pandas as _pd
except ImportError:  # pragma: no cover - depends on the machine
    _pd = None


def _frame(rows):
    """A DataFrame when pandas is installed, else the list of dicts."""
    return _pd.DataFrame(rows) if _pd is not None else rows


class Results:
    """A run's results (from run() or load_results()).

    trials    one row per trial (series, scheme, rate, replicate, method,
              status, reason, masked, unfilled, clipped, then one column per
              metric; `fit` where a method records its fitted model):
              a DataFrame when pandas is installed, else a list of dicts
    ranking   the ranked table: one row per series, scheme, rate and method,
              with the rank, the standing against the best, and the ranking
              metric's mean and 95% interval (as ranking.csv)
    verdict   per series: {series: {recommended, equally_good, reasons,
              caveats, ...}}, the one verdict every report prints
    warnings  a list of dicts (code, where, message, hint)
    json      results.json as a dict; to_json() gives its text
    write(folder) writes every report `gapmark run` writes.
    """

    def __init__(self, handle):
        self._handle = handle
        self._text = None
        self._json = None

    def to_json(self):
        """results.json as the command line writes it (text)."""
        if self._text is None:
            self._text = self._handle.json_text()
        return self._text

    @property
    def json(self):
        if self._json is None:
            self._json = json.loads(self.to_json())
        return self._json

    @property
    def rank_by(self):
        return self.json["rank_by"]

    @property
    def trials(self):
        rows = []
        for t in self.json["trials"]:
            row = {k: v for k, v in t.items() if k not in ("metrics", "fit")}
            for name, value in t.get("metrics", {}).items():
                row[name] = float("nan") if value is None else value
            if "fit" in t:
                row["fit"] = t["fit"]
            rows.append(row)
        return _frame(rows)

    @property
    def ranking(self):
        summary = self.json["summary"]
        rank_by = summary["rank_by"]
        rows = []
        for group in summary["groups"]:
            for m in group["methods"]:
                metric = m.get("metrics", {}).get(rank_by, {})
                rows.append({
                    "series": group["series"], "scheme": group["scheme"], "rate": group["rate"],
                    "rank": m.get("rank"), "method": m["method"], "standing": m.get("standing"),
                    rank_by: metric.get("mean"), "ci_low": metric.get("ci_low"),
                    "ci_high": metric.get("ci_high"), "mean_rank": m.get("mean_rank"),
                    "p_vs_best": m.get("p_vs_best"), "p_equivalent": m.get("p_equivalent"),
                    "trials": m.get("trials"), "failures": m.get("failures")})
        return _frame(rows)

    @property
    def verdict(self):
        return {v["series"]: v for v in self.json["verdict"]["series"]}

    @property
    def warnings(self):
        return list(self.json["warnings"])

    def write(self, folder, *, force=False, threads=None):
        """Writes every report the command line writes (results.json,
        ranking.md, ranking.csv, report.html, methods.md, references.bib)
        into `folder`, created when missing; a folder that is not empty is
        refused unless force=True. Returns the paths written."""
        return list(self._handle.write(os.fspath(folder), bool(force), int(threads or os.cpu_count() or 1)))

    def __repr__(self):
        j = self.json
        return f"Results({j['context'].get('spec_name')!r}: {len(j['trials'])} trials, " \
               f"{len(j['series'])} series, {len(j['warnings'])} warnings)"


def load_results(path):
    """The Results of a results.json written by any run."""
    return Results(_engine._load_results(os.fspath(path)))
