// What a person looks at after a run: the XDMF sidecar for ParaView (io/results/xdmf_writer.h) and the
// figures of tools/plot/yeegap_plot.py (PNG and SVG next to the results file).
#pragma once

#include <string>

namespace yeegap::cli {

/// Writes `<results>.xmf` next to the results file. On failure prints why on stderr and returns
/// false; the results file itself is never touched.
bool write_viewer_file(const std::string& results);

/// Runs the plot script on `results` with the system Python and waits for it. Returns true when it
/// wrote its figures; otherwise prints why on stderr (with an install hint when Python, matplotlib
/// or h5py is missing) and returns false. The script is $YEEGAP_PLOT_SCRIPT if set, else
/// tools/plot/yeegap_plot.py of the source tree this program was built from; the interpreter is
/// $YEEGAP_PYTHON if set, else /usr/bin/python3 (Debian's, which has the packages), else python3.
/// The script's own output goes to stderr, so a `--json` object on stdout stays alone there.
bool make_plots(const std::string& results);

}  // namespace yeegap::cli
