"""Probe time series of a results file: each recorded component against time in fs, E and H on
separate panels. H samples are taken half a step before E (the leapfrog), so each component is
drawn at its own true times: `time` plus its `sample_time_offset` (docs/results_file.md)."""
import numpy as np

from plot_common import new_figure, texts


def probe_figure(name, g):
    components = texts(g.attrs.get("components", []))
    electric = [c for c in components if c.startswith("E")]
    magnetic = [c for c in components if c.startswith("H")]
    groups = [(cs, unit) for cs, unit in ((electric, "V/m"), (magnetic, "A/m")) if cs]
    if not groups:
        return None
    fig, axes = new_figure(len(groups))
    time = g["time"][...]
    for ax, (cs, unit) in zip(axes, groups):
        for c in cs:
            d = g[c]
            t = time + float(d.attrs.get("sample_time_offset", 0.0))
            ax.plot(t * 1e15, d[...], lw=0.9, label=c)
        ax.set_ylabel(f"field ({unit})")
        ax.legend(fontsize="small", loc="upper right")
        ax.grid(True, alpha=0.3)
    position = np.asarray(g.attrs.get("position", [np.nan] * 3)) * 1e9
    axes[0].set_title(f"Probe {name} at ({position[0]:.4g}, {position[1]:.4g}, {position[2]:.4g}) nm")
    axes[-1].set_xlabel("time (fs)")
    return fig
