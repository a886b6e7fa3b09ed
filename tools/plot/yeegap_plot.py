#!/usr/bin/python3
"""Figures of a yeegap results file (layout: docs/results_file.md), written next to it as PNG and SVG:
  <stem>_flux            power of every flux output against wavelength (and relative to the dipole
                         alone when the scene has one dipole)
  <stem>_probe_<name>    each probe's time series
  <stem>_<map>_<wl>nm    |E|^2 of each field map at each wavelength, with the material boundaries
                         (|E|^2/|E_inc|^2 when the run has a plane wave)
  <stem>_<name>          cross sections against wavelength; far-field directivity, polar
  <stem>_sensor_<name>   each sensor output's R(theta), before and after the index raise, dips marked
  <stem>_<name>          any other output recorded against time: its series
For a sweep's merged table (sweep.h5, format yeegap-sweep) instead:
  <stem>_<output>_<quantity>  a heat map of that spectrum over the swept parameter and the
                         wavelength (plot_sweep.py), read from the point files beside the table
Headless (matplotlib's Agg backend). `yeegap view` and `yeegap run --plot` run this script.

Usage: yeegap_plot.py RESULTS.h5|sweep.h5 [--out-dir DIR] [--formats png,svg]
Exit codes: 0 figures written, 1 a failure while plotting, 2 not a readable results file,
3 numpy, h5py or matplotlib missing (with the packages to install)."""
import argparse
import os
import sys

EXIT_FAILURE, EXIT_NOT_RESULTS, EXIT_MISSING_PACKAGES = 1, 2, 3
HINT = "install python3-matplotlib python3-h5py, or run tools/setup.sh"


def say(message):
    print(f"yeegap_plot: {message}", file=sys.stderr)


def import_stack():
    """numpy, h5py and matplotlib (Agg), or a clear hint and exit code 3 instead of a traceback."""
    try:
        import numpy  # noqa: F401
        import h5py  # noqa: F401
        import matplotlib
    except ImportError as e:
        say(f"no plots: Python module '{e.name or e}' is missing for {sys.executable}; {HINT}")
        sys.exit(EXIT_MISSING_PACKAGES)
    matplotlib.use("Agg")


def parse_arguments(argv):
    p = argparse.ArgumentParser(description="Write PNG and SVG figures of a yeegap results file.")
    p.add_argument("results", help="results file (HDF5) written by yeegap run, or a sweep's sweep.h5")
    p.add_argument("--out-dir", help="where to write the figures (default: next to the results file)")
    p.add_argument("--formats", default="png,svg", help="comma-separated image formats (default: png,svg)")
    return p.parse_args(argv)


def write_figures(results, out_dir, formats):
    """Makes every figure of the results file (or sweep table); returns the written paths and notes
    for the user."""
    from plot_common import open_results, output_stem, outputs_of_kind, save, text, wavelength_label
    from plot_field_maps import field_map_figures
    from plot_orders import orders_figure
    from plot_particles import cross_sections_figure, far_field_figure
    from plot_probes import probe_figure
    from plot_sensor import sensor_figure
    from plot_spectra import flux_figure
    from plot_time_series import time_series_figure
    from plot_sweep import is_sweep_table, sweep_figures

    written, notes = [], []
    if is_sweep_table(results):
        for stem, fig in sweep_figures(results, out_dir, formats, notes):
            written += save(fig, stem, formats)
        return written, notes
    with open_results(results) as f:
        fig = flux_figure(f, notes)
        if fig is not None:
            written += save(fig, output_stem(results, out_dir, "flux"), formats)
        for name, g in outputs_of_kind(f, "probe"):
            fig = probe_figure(name, g)
            if fig is not None:
                written += save(fig, output_stem(results, out_dir, "probe", name), formats)
        for kind, figure in (("cross_sections", cross_sections_figure), ("far_field", far_field_figure)):
            for name, g in outputs_of_kind(f, kind):
                fig = figure(name, g)
                if fig is not None:
                    written += save(fig, output_stem(results, out_dir, name), formats)
        for name, g in outputs_of_kind(f, "orders"):
            fig = orders_figure(name, g)
            if fig is not None:
                written += save(fig, output_stem(results, out_dir, name), formats)
        for name, g in outputs_of_kind(f, "field_map"):
            for wl, fig in field_map_figures(f, name, g):
                written += save(fig, output_stem(results, out_dir, name, wavelength_label(wl) + "nm"), formats)
        for name, g in outputs_of_kind(f, "sensor"):
            written += save(sensor_figure(name, g), output_stem(results, out_dir, "sensor", name), formats)
        own_figures = {"flux", "reflectance", "probe", "cross_sections", "far_field", "orders", "field_map", "sensor"}
        for name, g in sorted(f["outputs"].items()) if "outputs" in f else []:
            kind = text(g.attrs.get("kind", b""))
            fig = None if kind in own_figures else time_series_figure(name, kind, g)
            if fig is not None:
                written += save(fig, output_stem(results, out_dir, name), formats)
    return written, notes


def main(argv):
    args = parse_arguments(argv)
    import_stack()
    sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
    from plot_common import NotResults

    out_dir = args.out_dir or os.path.dirname(os.path.abspath(args.results))
    formats = [x.strip() for x in args.formats.split(",") if x.strip()]
    try:
        written, notes = write_figures(args.results, out_dir, formats)
    except NotResults as e:
        say(f"no plots: {e}")
        return EXIT_NOT_RESULTS
    except Exception as e:  # a message, not a traceback; YEEGAP_PLOT_DEBUG=1 shows where
        if os.environ.get("YEEGAP_PLOT_DEBUG"):
            raise
        say(f"no plots: {type(e).__name__}: {e} (YEEGAP_PLOT_DEBUG=1 shows where)")
        return EXIT_FAILURE
    for note in notes:
        say(note)
    if not written:
        say(f"{args.results} has no output to plot")
    else:
        say(f"{len(written)} figures in {out_dir}: " + ", ".join(os.path.basename(p) for p in written))
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
