"""Figures of what a lit particle does: its cross sections against wavelength (the `cross_sections`
output) and its far-field pattern in polar form (the `far_field` output), one figure each.
Layout of both groups: docs/results_file.md."""
import numpy as np

from plot_common import DPI, FIGURE_SIZE_IN, new_figure


def cross_sections_figure(name, g):
    """Scattering, absorption and extinction of one `cross_sections` output against wavelength,
    in nm² (nm per unit length in a 2D run)."""
    wl = g["wavelength_nm"][...]
    if len(wl) < 2:
        return None
    per_length = bool(g.attrs.get("per_unit_length", 0))
    scale, unit = (1e9, "nm") if per_length else (1e18, "nm²")
    order = np.argsort(wl)
    fig, (ax,) = new_figure(1)
    for key, style in (("extinction", "-"), ("scattering", "--"), ("absorption", ":")):
        ax.plot(wl[order], g[key][...][order] * scale, style, label=key)
    peak = int(np.argmax(g["extinction"][...]))
    ax.axvline(wl[peak], color="grey", lw=0.8, alpha=0.6)
    ax.annotate(f"{wl[peak]:.0f} nm", (wl[peak], g["extinction"][peak] * scale), textcoords="offset points",
                xytext=(6, -12), fontsize=8)
    ax.set_xlabel("wavelength (nm)")
    ax.set_ylabel(f"cross section ({unit}{' per unit length' if per_length else ''})")
    ax.set_title(f"{name}: cross sections")
    ax.grid(True, alpha=0.3)
    ax.legend()
    return fig


def principal_cuts(theta, phi, theta_count, phi_count):
    """For a θ × φ grid (φ fastest), the planes through the z axis that the grid holds: a list of
    (label, signed polar angle from +z, indices). A plane is the φ cut joined with its φ + π cut
    when the grid has both, so the pattern is drawn all round."""
    theta = theta.reshape(theta_count, phi_count)[:, 0]
    phis = phi.reshape(theta_count, phi_count)[0, :]
    cuts, used = [], set()
    for j, p in enumerate(phis):
        if j in used:
            continue
        used.add(j)
        opposite = [k for k, q in enumerate(phis) if k not in used and abs(((q - p - np.pi) + np.pi) % (2 * np.pi) - np.pi) < 1e-9]
        rows = [i * phi_count + j for i in range(theta_count)]
        angles = list(theta)
        if opposite:
            k = opposite[0]
            used.add(k)
            # The φ + π half: polar angle -θ, walked from the -z pole back to +z.
            rows += [i * phi_count + k for i in reversed(range(theta_count))]
            angles += [-t for t in reversed(theta)]
        cuts.append((f"φ = {np.degrees(p):.0f}°", np.array(angles), np.array(rows)))
    return cuts


def far_field_figure(name, g):
    """Directivity in the planes through the z axis (polar plot, θ from +z) at each frequency of a
    `far_field` output whose directions are a θ × φ grid; None for a list of directions."""
    tc, pc = int(g.attrs.get("theta_count", 0)), int(g.attrs.get("phi_count", 0))
    if tc < 3 or pc < 1:
        return None
    import matplotlib.pyplot as plt

    theta, phi = g["theta"][...], g["phi"][...]
    directivity, wl = g["directivity"][...], g["wavelength_nm"][...]
    cuts = principal_cuts(theta, phi, tc, pc)
    fig = plt.figure(figsize=FIGURE_SIZE_IN, dpi=DPI, layout="constrained")
    ax = fig.add_subplot(111, projection="polar")
    ax.set_theta_zero_location("N")  # +z up
    ax.set_theta_direction(-1)
    colours = plt.rcParams["axes.prop_cycle"].by_key()["color"]
    styles = ["-", "--", ":", "-."]
    for q in range(min(len(wl), 4)):
        for c, (label, angles, rows) in enumerate(cuts[:len(colours)]):
            ax.plot(angles, directivity[q][rows], styles[q % len(styles)], color=colours[c % len(colours)],
                    label=f"{label}, {wl[q]:.0f} nm")
    ax.set_title(f"{name}: directivity (θ from +z)", pad=18)
    ax.legend(loc="lower left", bbox_to_anchor=(-0.15, -0.15), fontsize=8)
    return fig
