"""Any output that records against time and has no figure of its own: each 1-d dataset as long as its `time`, or as long as a `<name>_time` it names, drawn
against time in fs, one panel per unit. Reads only the results file's generic layout
(docs/results_file.md), so a new time-series output is plotted without a line here."""
from plot_common import new_figure, text


def time_series_figure(name, kind, g):
    if "time" not in g:
        return None
    series = {}
    for key in g:
        d = g[key]
        if key.endswith("time") or len(d.shape) != 1:
            continue
        times = g[key + "_time"][...] if key + "_time" in g else g["time"][...]
        if d.shape[0] != len(times):
            continue
        unit = text(d.attrs.get("units", b"1"))
        series.setdefault(unit, []).append((key, times, d[...]))
    if not series:
        return None
    fig, axes = new_figure(len(series))
    for ax, (unit, curves) in zip(axes, sorted(series.items())):
        for key, t, v in curves:
            ax.plot(t * 1e15, v, lw=0.9, label=key)
        ax.set_ylabel(f"({unit})")
        ax.legend(fontsize="small", loc="upper right")
        ax.grid(True, alpha=0.3)
    axes[0].set_title(f"{kind} {name}")
    axes[-1].set_xlabel("time (fs)")
    return fig
