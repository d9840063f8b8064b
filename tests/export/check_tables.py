"""Loads an export's tidy CSVs with pandas and checks them against its report JSON.

Run with Debian's /usr/bin/python3 (python3-pandas). Exit 0 when everything matches; otherwise
prints what differs and exits 1. Reference: pandas' own CSV reader, independent of our code.
"""
import json
import math
import sys

import pandas as pd


def close(a, b, tol=1e-6):
    if a is None or (isinstance(a, float) and math.isnan(a)):
        return b is None or (isinstance(b, float) and math.isnan(b))
    if b is None or (isinstance(b, float) and math.isnan(b)):
        return False
    return abs(float(a) - float(b)) <= tol * max(1.0, abs(float(b)))


def main(out_dir):
    problems = []
    with open(f"{out_dir}/report.json", encoding="utf-8") as f:
        report = json.load(f)
    with open(f"{out_dir}/export.json", encoding="utf-8") as f:
        provenance = json.load(f)
    for key in ("software", "project", "video", "video_signature", "capture_rate_fps",
                "exported_utc"):
        if not provenance.get(key):
            problems.append(f"export.json {key} missing")
    if "export" in report.get("extra", {}):
        problems.append("report.json carries extra.export: provenance belongs in export.json")

    tables = {}
    for name in ("events", "strides", "limbs", "phases", "support", "bouts", "symmetry", "dap"):
        path = f"{out_dir}/tables/{name}.csv"
        tables[name] = pd.read_csv(path, comment="#")
        with open(path, encoding="utf-8") as f:
            head = f.read(2000)
        for needle in ("# stridemark", "# input:", "capture_rate_fps"):
            if needle not in head:
                problems.append(f"{name}.csv header block lacks '{needle}'")

    # Summary tables lead with scope, gait and bout: the pooled trial, each gait, each bout.
    limbs = tables["limbs"]
    scopes = [("trial", None, None, report["limbs"], report["phase"])]
    for gait, summary in report.get("by_gait", {}).items():
        scopes.append(("gait", gait, None, summary["limbs"], summary["phase"]))
    for i, bout in enumerate(report["bouts"]):
        scopes.append(("bout", bout["gait"], i, bout["summary"]["limbs"], bout["summary"]["phase"]))

    def in_scope(table, scope, gait, bout):
        rows = table[table["scope"] == scope]
        if gait is not None:
            rows = rows[rows["gait"] == gait]
        if bout is None:
            return rows[rows["bout"].isna()]
        return rows[rows["bout"] == bout]

    for scope, gait, bout, limb_stats, _ in scopes:
        where = f"{scope} {gait or ''} {'' if bout is None else bout}".strip()
        rows_here = in_scope(limbs, scope, gait, bout)
        for label, stats in limb_stats.items():
            for measure in ("stride_s", "stance_s", "swing_s", "duty_factor"):
                row = rows_here[(rows_here["limb"] == label) & (rows_here["measure"] == measure)]
                if len(row) != 1:
                    problems.append(f"limbs.csv has {len(row)} rows for {where} {label} {measure}")
                    continue
                for field in ("n", "mean", "sd", "cv"):
                    if not close(row.iloc[0][field], stats[measure][field]):
                        problems.append(f"limbs.csv {where} {label} {measure} {field}: "
                                        f"{row.iloc[0][field]} vs JSON {stats[measure][field]}")
    trial_rows = limbs[limbs["scope"] == "trial"]
    expected_gait = "mixed" if report.get("mixed_gaits") else None
    if expected_gait is None and not trial_rows["gait"].isna().all():
        problems.append("limbs.csv trial rows name a gait for a single-gait trial")
    if expected_gait is not None and not (trial_rows["gait"] == expected_gait).all():
        problems.append("limbs.csv trial rows of a mixed trial are not marked 'mixed'")

    strides = tables["strides"]
    n_strides = strides["stride"].nunique() if len(strides) else 0
    if n_strides != len(report["strides"]):
        problems.append(f"strides.csv has {n_strides} strides, JSON {len(report['strides'])}")
    for k, stride in enumerate(report["strides"]):
        rows = strides[strides["stride"] == k]
        for _, row in rows.iterrows():
            if row["start_frame"] != stride["start_frame"] or row["gait"] != stride["gait"]:
                problems.append(f"strides.csv stride {k} differs from JSON")
            bout = None if pd.isna(row["bout"]) else int(row["bout"])
            if bout != stride["bout"] or bool(row["steady"]) != stride["steady"]:
                problems.append(f"strides.csv stride {k} bout or steady differs from JSON")
            if not close(row["duty_factor"], stride["duty_factor"][row["limb"]]):
                problems.append(f"strides.csv stride {k} {row['limb']} duty factor differs")

    phases = tables["phases"]
    for scope, gait, bout, _, phase_stats in scopes:
        rows_here = in_scope(phases, scope, gait, bout)
        for label, stats in phase_stats.items():
            row = rows_here[rows_here["limb"] == label]
            if len(row) != 1 or not close(row.iloc[0]["mean_cycles"], stats["mean"]):
                problems.append(f"phases.csv {scope} {gait or ''} {label} mean differs from JSON")

    # DAP per diagonal: one block of rows per scope whose summary has a dap, none otherwise.
    dap = tables["dap"]
    with open(f"{out_dir}/tables/dap.csv", encoding="utf-8") as f:
        if "# sign convention:" not in f.read(4000):
            problems.append("dap.csv does not state its sign convention")
    dap_scopes = [("trial", None, None, report.get("dap"))]
    for gait, summary in report.get("by_gait", {}).items():
        dap_scopes.append(("gait", gait, None, summary["dap"]))
    for i, bout in enumerate(report["bouts"]):
        dap_scopes.append(("bout", bout["gait"], i, bout["summary"]["dap"]))
    for scope, gait, bout, value in dap_scopes:
        rows_here = dap[dap["scope"] == scope]
        if scope != "trial":
            rows_here = in_scope(dap, scope, gait, bout)
        where = f"dap.csv {scope} {gait or ''} {'' if bout is None else bout}".strip()
        if value is None:
            if len(rows_here):
                problems.append(f"{where}: {len(rows_here)} rows where the JSON has no DAP")
            continue
        expected = {"LH-RF": (value["lh_rf_ms"], value["lh_rf_percent"]),
                    "RH-LF": (value["rh_lf_ms"], value["rh_lf_percent"])}
        for diagonal, (ms, pct) in expected.items():
            row = rows_here[rows_here["diagonal"] == diagonal]
            if len(row) != 1:
                problems.append(f"{where} {diagonal}: {len(row)} rows")
                continue
            r = row.iloc[0]
            for got, want in ((r["n"], ms["n"]), (r["mean_ms"], ms["mean"]), (r["sd_ms"], ms["sd"]),
                              (r["mean_percent"], pct["mean"]), (r["sd_percent"], pct["sd"])):
                if not close(got, want):
                    problems.append(f"{where} {diagonal}: {got} vs JSON {want}")
        for diagonal, key in (("mean", "mean_ms"), ("difference", "difference_ms")):
            row = rows_here[rows_here["diagonal"] == diagonal]
            if len(row) != 1 or not close(row.iloc[0]["mean_ms"], value[key]):
                problems.append(f"{where} {diagonal} differs from JSON {key}")

    events = tables["events"]
    if not {"limb", "event", "frame", "time_s"} <= set(events.columns):
        problems.append(f"events.csv columns {list(events.columns)}")

    for p in problems:
        print(p)
    print(f"checked {len(report['limbs'])} limbs, {len(report['strides'])} strides, "
          f"{len(events)} events: {'OK' if not problems else 'MISMATCH'}")
    return 1 if problems else 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1]))
