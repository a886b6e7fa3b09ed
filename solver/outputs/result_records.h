// Each kind of result as a record (record.h), and the whole run's records in the order `yeegap run`
// prints them. Every record_of lives beside the output that computes the result; records_of is the
// catalogue. Outputs that make records directly put them in RunResults::records.
#pragma once

#include <vector>

#include "solver/outputs/record.h"
#include "solver/results.h"
#include "solver/scene.h"

namespace yeegap::solver {

Record record_of(const ProbeResult& p, double time_step);
/// The record views the map's values (ComplexSlabs): keep `m` alive while the record is used.
Record record_of(const FieldMapResult& m, const RunResults& run);
Record record_of(const FluxResult& x, const RunResults& run, const Scene& scene);
Record record_of(const ReflectanceResult& x);
Record record_of(const DiffractionOrdersResult& x);
Record record_of(const CrossSectionResult& x);
Record record_of(const FarFieldResult& x, const RunResults& run, const Scene& scene);
Record record_of(const DecayRateResult& x);
Record record_of(const SensorResult& s);

/// A row's first cell: the vacuum wavelength of `omega` ("    612.34 nm" on the terminal); with
/// an empty key, terminal only.
Cell wavelength_cell(double omega, const char* key = "wavelength_nm");

/// Every output's record: the typed results above, then RunResults::records.
std::vector<Record> records_of(const RunResults& run, const Scene& scene);

/// A power relative to the run's one dipole alone in the scene's background, at the same frequency:
/// P / P0 with P0 = n eta0 k0^2 |I l|^2 / (12 pi) (Jackson 1999, eq. 9.24, with eta = eta0/n and
/// k = n k0). Only for a run with exactly one dipole.
double relative_to_dipole_alone(const RunResults& run, const Scene& scene, double omega, double power);

}  // namespace yeegap::solver
