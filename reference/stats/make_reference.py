#!/usr/bin/python3
"""Reference values for the statistics in include/gapmark/stats/.

Run with Debian's Python (it has scipy and statsmodels) from the repository root:
    /usr/bin/python3 reference/stats/make_reference.py
It makes invented example data with a fixed seed, computes the reference
values with scipy.stats, statsmodels and R's stats package (through
reference/stats/r_reference.R, base R only), and writes one JSON file per
concept beside this script. Same libraries, same bytes.

The data are invented by the generator below; they describe nothing real.
"""
import json
import math
import os
import platform
import subprocess
import tempfile

import numpy as np
import scipy
import scipy.stats as st
import statsmodels
from statsmodels.stats.multitest import multipletests

HERE = os.path.dirname(os.path.abspath(__file__))
SEED = 20240611
RSCRIPT = "/usr/bin/Rscript"


def r_version():
    out = subprocess.run([RSCRIPT, "-e", "cat(R.version.string)"],
                         capture_output=True, text=True, check=True)
    return out.stdout.strip()


VERSIONS = {
    "python": platform.python_version(),
    "numpy": np.__version__,
    "scipy": scipy.__version__,
    "statsmodels": statsmodels.__version__,
    "R": r_version(),
}


def num(x):
    """A float for JSON: NaN becomes null."""
    x = float(x)
    return None if math.isnan(x) else x


def fmt(values):
    return ",".join("NA" if math.isnan(v) else repr(float(v)) for v in values)


class RBatch:
    """Collects R requests, runs r_reference.R once, returns {name: {quantity: value}}."""

    def __init__(self):
        self.lines = []

    def add(self, kind, name, a, b, values, extra=""):
        self.lines.append("\t".join([kind, name, str(a), str(b), fmt(values), str(extra)]))

    def run(self):
        with tempfile.NamedTemporaryFile("w", suffix=".tsv", delete=False) as f:
            f.write("\n".join(self.lines) + "\n")
            path = f.name
        try:
            out = subprocess.run([RSCRIPT, os.path.join(HERE, "r_reference.R"), path],
                                 capture_output=True, text=True, check=True).stdout
        finally:
            os.unlink(path)
        result = {}
        for line in out.splitlines():
            name, quantity, value = line.split("\t")
            result.setdefault(name, {})[quantity] = None if value == "NA" else float(value)
        return result


def write(filename, description, cases, extra=None):
    doc = {
        "description": description,
        "generated_by": "reference/stats/make_reference.py (seed %d)" % SEED,
        "data": "invented by the seeded generator; describes nothing real",
        "versions": VERSIONS,
    }
    if extra:
        doc.update(extra)
    doc["cases"] = cases
    with open(os.path.join(HERE, filename), "w") as f:
        json.dump(doc, f, indent=1)
        f.write("\n")


rng = np.random.default_rng(SEED)
rb = RBatch()

# ---------------------------------------------------------------- ranks
rank_cases = []
for name, x in [
    ("distinct_6", rng.normal(size=6)),
    ("ties_12", np.round(rng.normal(size=12), 0)),
    ("all_equal_4", np.full(4, 2.5)),
    ("single", np.array([7.0])),
]:
    rank_cases.append({"name": name, "x": [float(v) for v in x],
                       "scipy_rankdata_average": [float(v) for v in st.rankdata(x, method="average")]})

# ---------------------------------------------------------------- descriptive / t interval
t_cases = []
for n in (2, 3, 10, 50):
    x = rng.normal(loc=4.0, scale=2.0, size=n)
    for level in (0.90, 0.95, 0.99):
        name = "n%d_level%g" % (n, level)
        low, high = st.t.interval(level, n - 1, loc=np.mean(x), scale=st.sem(x))
        t_cases.append({"name": name, "x": [float(v) for v in x], "level": level,
                        "scipy": {"mean": float(np.mean(x)), "sd": float(np.std(x, ddof=1)),
                                  "low": float(low), "high": float(high)}})
        rb.add("tinterval", name, n, 0, x, level)

# ---------------------------------------------------------------- Friedman
friedman_specs = [
    ("no_ties_12x4", rng.normal(size=(12, 4)) + np.array([0.0, 0.3, 0.6, 0.2])),
    ("ties_10x5", np.round(rng.normal(size=(10, 5)) * 1.5 + np.array([0, 1, 0, 2, 1]))),
    ("small_5x3", rng.normal(size=(5, 3))),
    ("strong_20x6", rng.normal(size=(20, 6)) + np.arange(6) * 0.8),
    ("tied_row_6x3", np.vstack([np.full((1, 3), 1.0), np.round(rng.normal(size=(5, 3)), 0)])),
    ("two_methods_9x2", rng.normal(size=(9, 2)) + np.array([0.0, 0.5])),
]
friedman_cases = []
for name, y in friedman_specs:
    blocks, k = y.shape
    case = {"name": name, "blocks": blocks, "treatments": k,
            "values": [float(v) for v in y.ravel()]}
    ranks = np.vstack([st.rankdata(row, method="average") for row in y])
    case["scipy_mean_ranks"] = [float(v) for v in ranks.mean(axis=0)]
    if k >= 3:  # scipy.stats.friedmanchisquare needs three or more treatments
        stat, p = st.friedmanchisquare(*[y[:, j] for j in range(k)])
        case["scipy"] = {"statistic": float(stat), "p": float(p)}
    else:
        case["scipy"] = None
    # Iman-Davenport from the untied Friedman form (Demsar 2006, eq. for F_F),
    # its p-value from scipy.stats.f; and the untied chi2 from scipy.stats.chi2.
    R = ranks.mean(axis=0)
    chi2 = 12.0 * blocks / (k * (k + 1)) * (np.sum(R ** 2) - k * (k + 1) ** 2 / 4.0)
    ff = (blocks - 1) * chi2 / (blocks * (k - 1) - chi2)
    case["from_mean_ranks"] = {
        "chi2": float(chi2), "chi2_p": float(st.chi2.sf(chi2, k - 1)),
        "f": float(ff), "f_df1": k - 1, "f_df2": (k - 1) * (blocks - 1),
        "f_p": float(st.f.sf(ff, k - 1, (k - 1) * (blocks - 1)))}
    friedman_cases.append(case)
    rb.add("friedman", name, blocks, k, y.ravel())

# ---------------------------------------------------------------- Wilcoxon signed-rank
wilcoxon_specs = [
    # name, differences, library method ("exact" or "normal")
    ("exact_n12", rng.normal(loc=0.4, size=12), "exact"),
    ("exact_n7_all_positive", np.abs(rng.normal(size=7)) + 0.1, "exact"),
    ("exact_center_n4", np.array([1.0, -2.0, -3.0, 4.0]), "exact"),
    ("exact_n30_null", rng.normal(size=30), "exact"),
    ("exact_n50", rng.normal(loc=0.3, size=50), "exact"),
    ("ties_n15", np.floor(rng.normal(loc=0.5, size=15) * 4) / 4 + 0.125, "normal"),
    ("zeros_n20", np.round(rng.normal(loc=-0.2, size=20) * 2, 0), "normal"),
    ("normal_n51", rng.normal(loc=0.2, size=51), "normal"),
    ("normal_n80", rng.normal(loc=-0.25, size=80), "normal"),
    ("ties_zeros_n120", np.round(rng.normal(loc=0.15, size=120), 1), "normal"),
]
wilcoxon_cases = []
for name, d, method in wilcoxon_specs:
    n_zero = int(np.sum(d == 0))
    nonzero = d[d != 0]
    has_ties = len(np.unique(np.abs(nonzero))) < len(nonzero)
    # scipy 1.10.1, mode="auto": exact when len(d) <= 50, switched to the
    # normal approximation when there are zeros. With tied |d| it stays on
    # "exact" and truncates a half-integer W+; the library uses the normal
    # approximation there instead, so those cases compare with mode="approx".
    auto = st.wilcoxon(d)
    scipy_mode = "exact" if (len(d) <= 50 and n_zero == 0) else "approx"
    if method == "normal":
        res = st.wilcoxon(d, mode="approx", correction=False)
    else:
        res = auto
        assert scipy_mode == "exact"
    case = {"name": name, "differences": [float(v) for v in d], "method": method,
            "zeros": n_zero, "ties": bool(has_ties),
            "scipy": {"statistic": float(res.statistic), "p": float(res.pvalue),
                      "call": "wilcoxon(d)" if method == "exact"
                      else "wilcoxon(d, mode='approx', correction=False)"},
            "scipy_auto": {"statistic": float(auto.statistic), "p": float(auto.pvalue),
                           "mode": scipy_mode}}
    case["r_call"] = ("wilcox.test(d, exact = TRUE, correct = FALSE)" if method == "exact"
                      else "wilcox.test(d, exact = FALSE, correct = FALSE)")
    wilcoxon_cases.append(case)
    rb.add("wilcoxon", name, len(d), 0, d, method)

# ---------------------------------------------------------------- Holm
holm_specs = [
    ("uniform_8", rng.uniform(size=8), True),
    ("small_6", 10.0 ** rng.uniform(-5, -1, size=6), True),
    ("ties_7", np.array([0.01, 0.01, 0.04, 0.2, 0.2, 0.5, 0.03]), True),
    ("caps_5", np.array([0.3, 0.4, 0.5, 0.6, 0.9]), True),
    ("single_1", np.array([0.2]), True),
    ("with_nan_6", np.array([0.02, np.nan, 0.001, 0.04, np.nan, 0.3]), False),
]
holm_cases = []
for name, p, statsmodels_ok in holm_specs:
    case = {"name": name, "p": [num(v) for v in p]}
    if statsmodels_ok:
        case["statsmodels"] = [float(v) for v in multipletests(p, method="holm")[1]]
    else:
        case["statsmodels"] = None  # multipletests does not accept NaN
    holm_cases.append(case)
    rb.add("holm", name, len(p), 0, p)

# ---------------------------------------------------------------- studentized range
tukey_quantiles = []
for alpha in (0.05, 0.10):
    for k in range(2, 11):
        name = "q_inf_k%d_alpha%g" % (k, alpha)
        q = float(st.studentized_range.ppf(1 - alpha, k, np.inf))
        tukey_quantiles.append({"name": name, "k": k, "df": None, "alpha": alpha,
                                "scipy_q": q, "scipy_q_over_sqrt2": q / math.sqrt(2)})
        rb.add("qtukey", name, k, "Inf", [], 1 - alpha)
for k in (3, 5, 8):
    for df in (5, 10, 30, 120):
        name = "q_df%d_k%d_alpha0.05" % (df, k)
        q = float(st.studentized_range.ppf(0.95, k, df))
        tukey_quantiles.append({"name": name, "k": k, "df": df, "alpha": 0.05,
                                "scipy_q": q, "scipy_q_over_sqrt2": q / math.sqrt(2)})
        rb.add("qtukey", name, k, df, [], 0.95)
tukey_cdf = []
for k, df, q in [(2, None, 1.0), (3, None, 2.5), (4, None, 3.0), (6, None, 4.5),
                 (10, None, 2.0), (10, None, 6.0), (4, 10, 3.5), (3, 5, 2.0), (7, 30, 4.0)]:
    name = "cdf_k%d_df%s_q%g" % (k, "inf" if df is None else df, q)
    cdf = float(st.studentized_range.cdf(q, k, np.inf if df is None else df))
    tukey_cdf.append({"name": name, "k": k, "df": df, "q": q, "scipy_cdf": cdf})
    rb.add("ptukey", name, k, "Inf" if df is None else df, [], q)

# ---------------------------------------------------------------- summary wiring
# Trial tables for the ranking in src/analysis/summary.cpp, computed here
# with scipy and statsmodels under the library's stated conventions
# (docs/statistics.md):
#  - within a replicate, lower rmse ranks first, ties averaged, a trial with
#    no value ranks after every value (ties among such); differences at or
#    below 1e-9 times the condition's scale (median |rmse|) count as ties;
#  - the best method has the lowest mean rmse over its replicates with a value,
#    among the methods that filled every trial;
#  - each other method: Wilcoxon signed-rank on (method - best) over every
#    replicate, a failed trial being the worst outcome of its replicate (only
#    ranks and signs enter the test, so any value above all others gives the
#    same result: 1e6 here); exact p (scipy default) when n <= 50 with no
#    zero and no tied |d|, else wilcoxon(mode="approx", correction=False);
#    Holm over the k - 1 comparisons (statsmodels multipletests);
#  - equivalence: statsmodels ttost_paired(method, best, -margin, margin) with
#    margin = 0.05 * |best's mean| for methods without a failed trial, Holm
#    over those comparisons;
#  - standing: equivalent when the adjusted TOST p < alpha, else worse (or
#    better) when the adjusted signed-rank p < alpha, else not distinguishable;
#  - Friedman over replicates on the within-replicate ranks
#    (scipy.stats.friedmanchisquare);
#  - across series: per condition each series is a data set, methods ranked by
#    their mean rank in that condition (scipy.stats.rankdata); with several
#    conditions, each series' mean ranks are averaged over its conditions
#    first ("combined"), so N = the number of series; Friedman,
#    Iman-Davenport with scipy.stats.f.sf, critical difference from
#    scipy.stats.studentized_range.

EQUIVALENCE = 0.05
FAILED = 1e6


def wilcoxon_p(d):
    d = np.asarray(d, dtype=float)
    nonzero = d[d != 0]
    if len(nonzero) == 0:
        return 1.0, 0.0, 0
    ties = len(np.unique(np.abs(nonzero))) < len(nonzero)
    wplus = float(st.rankdata(np.abs(nonzero))[nonzero > 0].sum())
    if len(d) <= 50 and not ties and len(nonzero) == len(d):
        return float(st.wilcoxon(d).pvalue), wplus, len(nonzero)
    return float(st.wilcoxon(d, mode="approx", correction=False).pvalue), wplus, len(nonzero)


def group_reference(table, alpha):
    """table: replicates x methods rmse (NaN = failed)."""
    from statsmodels.stats.weightstats import ttost_paired
    reps, k = table.shape
    keyed = np.where(np.isnan(table), np.inf, table)
    ranks = np.vstack([st.rankdata(row, method="average") for row in keyed])
    means = np.array([np.mean(table[~np.isnan(table[:, m]), m]) for m in range(k)])
    failed = np.isnan(table).any(axis=0)
    best = int(np.argmin(np.where(failed, np.inf, means)))
    worst = np.where(np.isnan(table), FAILED, table)
    margin = EQUIVALENCE * abs(means[best])
    others = [m for m in range(k) if m != best]
    raw, worse, tost_raw = [], [], []
    for m in others:
        p, wplus, n = wilcoxon_p(worst[:, m] - worst[:, best])
        raw.append(p)
        worse.append(2 * wplus >= n * (n + 1) / 2)
        tost_raw.append(np.nan if failed[m] else float(ttost_paired(table[:, m], table[:, best], -margin, margin)[0]))
    adjusted = multipletests(raw, method="holm")[1]
    tested = [i for i, v in enumerate(tost_raw) if not np.isnan(v)]
    tost_adjusted = [np.nan] * len(others)
    for i, v in zip(tested, multipletests([tost_raw[i] for i in tested], method="holm")[1]):
        tost_adjusted[i] = float(v)
    stat, p = st.friedmanchisquare(*[ranks[:, m] for m in range(k)])
    out = {"best": best, "mean_rank": [float(v) for v in ranks.mean(axis=0)],
           "mean": [float(v) for v in means], "p_vs_best": [None] * k, "p_equivalent": [None] * k,
           "standing": ["best"] * k, "margin": float(margin),
           "friedman_statistic": float(stat), "friedman_p": float(p)}
    for i, m in enumerate(others):
        out["p_vs_best"][m] = float(adjusted[i])
        out["p_equivalent"][m] = num(tost_adjusted[i])
        if not np.isnan(tost_adjusted[i]) and tost_adjusted[i] < alpha:
            out["standing"][m] = "equivalent"
        elif adjusted[i] < alpha:
            out["standing"][m] = "worse" if worse[i] else "better"
        else:
            out["standing"][m] = "not distinguishable"
    return out


def across_reference(scores, alpha):
    """scores: data sets x methods, smaller is better (mean ranks within each data set)."""
    n, k = scores.shape
    ranks = np.vstack([st.rankdata(row, method="average") for row in scores])
    stat, p = st.friedmanchisquare(*[scores[:, m] for m in range(k)])
    ff = (n - 1) * stat / (n * (k - 1) - stat)
    q = float(st.studentized_range.ppf(1 - alpha, k, np.inf))
    return {"datasets": n, "mean_ranks": [float(v) for v in ranks.mean(axis=0)],
            "friedman_chi2": float(stat), "friedman_p": float(p),
            "iman_davenport_f": float(ff),
            "iman_davenport_p": float(st.f.sf(ff, k - 1, (k - 1) * (n - 1))),
            "critical_difference": q / math.sqrt(2) * math.sqrt(k * (k + 1) / (6.0 * n))}


def mean_ranks_of(table):
    keyed = np.where(np.isnan(table), np.inf, table)
    return np.vstack([st.rankdata(row, method="average") for row in keyed]).mean(axis=0)


SUMMARY_ALPHA = 0.05
summary_methods = ["m_a", "m_b", "m_c", "m_d"]
summary_trials = []


def add_trials(series, scheme, rate, table):
    for r in range(table.shape[0]):
        for m, method in enumerate(summary_methods):
            v = table[r, m]
            summary_trials.append({"series": series, "scheme": scheme, "rate": rate, "replicate": r,
                                   "method": method, "status": "failed" if np.isnan(v) else "ok",
                                   "rmse": num(v)})


# One group, ten replicates: m_c clearly worse, m_b slightly worse, m_d the
# best plus small rounded noise (zero differences and ties), one failed trial.
reps = 10
difficulty = rng.uniform(1.0, 2.0, size=reps)
group_table = np.column_stack([
    difficulty + rng.normal(0, 0.05, reps),
    difficulty + 0.04 + rng.normal(0, 0.05, reps),
    difficulty + 0.30 + rng.normal(0, 0.05, reps),
    np.zeros(reps)])
group_table[:, 3] = group_table[:, 0] + np.round(rng.normal(0, 0.02, reps), 2)
group_table[4, 2] = np.nan
add_trials("series_one", "scheme_x", 0.2, group_table)
group_expected = group_reference(group_table, SUMMARY_ALPHA)

# Across series: five series at two rates, three replicates each; in series
# s3 methods m_a and m_d give identical values (a tie across data sets).
across_means = {}
for rate, scale in ((0.1, 1.0), (0.3, 2.0)):
    rows = []
    for s_i in range(5):
        series = "s%d" % (s_i + 1)
        base = rng.uniform(0.5, 3.0)
        table = np.column_stack([base + scale * eff + rng.normal(0, 0.1, 3)
                                 for eff in (0.0, 0.1, 0.4, 0.05)])
        if series == "s3":
            table[:, 3] = table[:, 0]
        add_trials(series, "scheme_y", rate, table)
        rows.append(mean_ranks_of(table))
    across_means[rate] = np.array(rows)
across_expected = {
    "scheme_y@0.1": across_reference(across_means[0.1], SUMMARY_ALPHA),
    "scheme_y@0.3": across_reference(across_means[0.3], SUMMARY_ALPHA),
    "combined": across_reference((across_means[0.1] + across_means[0.3]) / 2, SUMMARY_ALPHA),
}
summary_doc = {"alpha": SUMMARY_ALPHA, "equivalence": EQUIVALENCE, "methods": summary_methods, "trials": summary_trials,
               "group": {"series": "series_one", "scheme": "scheme_x", "rate": 0.2, **group_expected},
               "across": across_expected}

# ---------------------------------------------------------------- run R and write
r = rb.run()
for case in t_cases:
    case["r"] = r[case["name"]]
for case in friedman_cases:
    case["r"] = r[case["name"]]
for case in wilcoxon_cases:
    case["r"] = r[case["name"]]
for case in holm_cases:
    vals = r[case["name"]]
    case["r_p_adjust"] = [vals["adjusted_%d" % i] for i in range(len(case["p"]))]
for case in tukey_quantiles:
    case["r_qtukey"] = r[case["name"]]["q"]
for case in tukey_cdf:
    case["r_ptukey"] = r[case["name"]]["cdf"]

write("ranks.json", "Average ranks (ties averaged, 1-based): scipy.stats.rankdata(x, method='average').",
      rank_cases)
write("t_interval.json",
      "Mean, sample sd and two-sided t interval: scipy.stats.t.interval(level, n-1, loc=mean, "
      "scale=scipy.stats.sem(x)); R t.test(x, conf.level=level)$conf.int.", t_cases)
write("friedman.json",
      "Friedman test, rows = blocks, columns = treatments: scipy.stats.friedmanchisquare(*columns) "
      "(k >= 3) and R friedman.test(matrix); mean ranks by scipy.stats.rankdata per row; "
      "from_mean_ranks: untied chi2_F and Iman-Davenport F_F (Demsar 2006 formulas) with p from "
      "scipy.stats.chi2.sf and scipy.stats.f.sf.", friedman_cases)
write("wilcoxon.json",
      "Wilcoxon signed-rank, two-sided, zeros dropped: scipy.stats.wilcoxon (call given per case) "
      "and R wilcox.test (call given per case; V = W+). scipy_auto is scipy's default call, kept "
      "to show where scipy 1.10.1's default differs (tied |d| with n <= 50).", wilcoxon_cases)
write("holm.json",
      "Holm step-down adjustment: R p.adjust(p, method='holm') (null = NA) and "
      "statsmodels.stats.multitest.multipletests(p, method='holm')[1].", holm_cases)
write("studentized_range.json",
      "Studentized range distribution: scipy.stats.studentized_range.ppf / .cdf (df = inf uses "
      "the infinite-df integral) and R qtukey / ptukey (df = Inf). R documents qtukey as a "
      "secant search with tolerance 1e-4, so its quantiles are coarse.",
      {"quantiles": tukey_quantiles, "cdf": tukey_cdf})
write("summary.json",
      "Ranking in summarize(): trial records and the expected per-group ranks, Friedman, Wilcoxon "
      "against the best with Holm, paired TOST (statsmodels ttost_paired) with Holm, standings, and "
      "across-series mean ranks (one data set per series), Friedman, Iman-Davenport and critical "
      "difference, from scipy.stats (rankdata, friedmanchisquare, wilcoxon, f, studentized_range) "
      "and statsmodels (multipletests, ttost_paired) under the conventions stated in "
      "make_reference.py.", summary_doc)
print("wrote ranks, t_interval, friedman, wilcoxon, holm, studentized_range, summary JSON to", HERE)
