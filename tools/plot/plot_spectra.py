"""Flux spectra of a results file: the power of every flux output against vacuum wavelength and,
when the scene has exactly one dipole, the same power relative to that dipole alone in the
background medium, P / P0 with P0 = n eta0 k0^2 |I l|^2 / (12 pi) (Jackson, Classical
Electrodynamics, 3rd ed., 1999, eq. 9.24, with eta = eta0/n and k = n k0): the normalisation
`yeegap run` prints. For a box around the dipole alone this is the total decay-rate enhancement;
for a box around everything, the radiative one."""
import numpy as np

from plot_common import new_figure, outputs_of_kind, text

C0 = 299792458.0            # m/s, exact (SI 2019)
ETA0 = 376.730313668        # ohm, CODATA 2018, as base/constants.h


def dipole_power_alone(omega, il, n):
    """Power (W s^2, like the flux spectra) of a dipole of current-moment spectrum il (A m s) in a
    lossless medium of index n: Jackson 1999, eq. 9.24."""
    k0 = omega / C0
    return n * ETA0 * k0**2 * np.abs(il) ** 2 / (12 * np.pi)


def background_index(f):
    """(n, None) with n the background's refractive index from the stored scene, as `yeegap run`
    takes it (the square root of its high-frequency permittivity), or (None, reason)."""
    try:
        import yaml
    except ImportError:
        return None, "python3-yaml is not installed"
    command_line = text(f["program"].attrs.get("command_line", b"")) if "program" in f else ""
    if "--set" in command_line and ("background" in command_line or "materials" in command_line):
        return None, "the run overrode materials or the background with --set"
    try:
        scene = yaml.safe_load(text(f["scene/text"][()]))
        name = (scene.get("domain") or {}).get("background", "vacuum")
        material = (scene.get("materials") or {}).get(name)
        if material is None:
            return (1.0, None) if name == "vacuum" else (None, f"background '{name}' is not in the scene")
        if "index" in material:
            return float(material["index"]), None
        if "permittivity" in material:
            return float(np.sqrt(float(material["permittivity"]))), None
        if "poles" in material:
            return float(np.sqrt(float((material["poles"] or {}).get("eps_inf", 1.0)))), None
        if "conductivity" in material:
            return 1.0, None  # conductivity alone adds to a permittivity of 1 (docs/scene.md)
        return None, f"background '{name}' has no index"
    except (yaml.YAMLError, KeyError, TypeError, ValueError, AttributeError) as e:
        return None, f"cannot read the scene's background: {e}"


def single_dipole_spectrum(f):
    """(omega, I l spectrum) of the one dipole of the scene, or None if there are none or several."""
    if "sources/spectrum_re" not in f:
        return None
    re, im = f["sources/spectrum_re"][...], f["sources/spectrum_im"][...]
    if re.ndim != 2 or re.shape[0] != 1:
        return None
    return f["sources/omega"][...], re[0] + 1j * im[0]


def relative_to_dipole(omegas, power, source, n):
    """P / P0 at each of `omegas`, the source spectrum matched by frequency; NaN where none matches."""
    source_omega, il = source
    rel = np.full(len(omegas), np.nan)
    for q, w in enumerate(omegas):
        match = np.flatnonzero(np.isclose(source_omega, w, rtol=1e-9, atol=0))
        if match.size:
            rel[q] = power[q] / dipole_power_alone(w, il[match[0]], n)
    return rel


def flux_label(name, g):
    if int(g.attrs.get("closed", 0)):
        return f"{name} (closed box, outward)"
    return f"{name} (plane, towards +{'xyz'[int(g.attrs.get('normal_axis', 0))]})"


def flux_figure(f, notes):
    """The flux spectra figure, or None if the file has no flux output. Appends to `notes` why the
    relative panel is missing when the scene has one dipole but no usable background index."""
    fluxes = outputs_of_kind(f, "flux")
    if not fluxes:
        return None
    source = single_dipole_spectrum(f)
    n = None
    if source is not None:
        n, why = background_index(f)
        if n is None:
            notes.append(f"flux: no 'relative to the dipole alone' panel: {why}")
    fig, axes = new_figure(2 if n is not None else 1)
    for name, g in fluxes:
        wl, omega, power = g["wavelength_nm"][...], g["omega"][...], g["power"][...]
        order = np.argsort(wl)
        axes[0].plot(wl[order], power[order], marker=".", label=flux_label(name, g))
        if n is not None:
            rel = relative_to_dipole(omega, power, source, n)
            axes[1].plot(wl[order], rel[order], marker=".", label=name)
    axes[0].set_ylabel("power spectrum (W s²)")
    axes[0].set_title("Power through each flux surface")
    if n is not None:
        axes[1].axhline(1.0, color="0.6", lw=0.8, ls="--")
        axes[1].set_ylabel("P / P₀ (dipole alone)")
        axes[1].set_title(f"Relative to the same dipole alone in the background (n = {n:g})")
        axes[1].legend(fontsize="small")
    axes[0].legend(fontsize="small")
    axes[-1].set_xlabel("vacuum wavelength (nm)")
    for ax in axes:
        ax.grid(True, alpha=0.3)
    return fig
