"""Diffraction orders of a plane wave in a Bloch cell (an `orders` output, docs/results_file.md): the
reflected and the transmitted orders' efficiencies against vacuum wavelength, one line per order,
with the sums over the orders of each side. An order exists only where it propagates, so its line
starts or stops at a Rayleigh anomaly (where it runs along the surface)."""
import numpy as np

from plot_common import new_figure


def orders_figure(name, g):
    """Two panels (reflected, transmitted; one when no transmitted order is reported), or None for
    an empty table."""
    row, side, order, eff = g["row"][...], g["side"][...], g["order"][...], g["efficiency"][...]
    if row.size == 0:
        return None
    wl = g["wavelength_nm"][...]
    sides = [(-1, "reflected", g["reflected_sum"][...])]
    if np.any(side > 0):
        sides.append((+1, "transmitted", g["transmitted_sum"][...]))
    two_d = bool(np.any(order[:, 1] != 0))
    fig, axes = new_figure(len(sides))
    for ax, (s, label, total) in zip(axes, sides):
        by_wl = np.argsort(wl)
        ax.plot(wl[by_wl], total[by_wl], color="k", lw=1.5, label=f"all {label} orders")
        picked = side == s
        for m in sorted({tuple(o) for o in order[picked]}):
            mine = picked & (order[:, 0] == m[0]) & (order[:, 1] == m[1])
            x, y = wl[row[mine]], eff[mine]
            keep = np.argsort(x)
            ax.plot(x[keep], y[keep], marker=".", label=f"m = ({m[0]}, {m[1]})" if two_d else f"m = {m[0]:+d}")
        ax.set_ylabel("power / incident power")
        ax.set_title(f"{name}: {label} orders")
        ax.legend(fontsize="small")
        ax.grid(True, alpha=0.3)
    axes[-1].set_xlabel("vacuum wavelength (nm)")
    return fig
