// Benchmarks (make bench): the Google Benchmark program behind the summary table of
// docs/performance.md. Each measurement is a Google Benchmark run: matrix fill per entry (one
// thread and all cores), dense solve against LAPACK on the same matrices, the whole program on
// one frequency, 351-point sweeps interpolated and exact, a 20-row batch; a reporter prints
// every run as Google Benchmark does, then the table (ratios to zgesv, fitted growth
// exponents) computed from those runs. Whole-program rows run build/bin/wirefield as a child
// process (manual time: the child's wall clock; its CPU time and peak memory as counters).
// Sizes up to WIREFIELD_BENCH_MAX unknowns (default 4000); Google Benchmark's flags apply.
#include <benchmark/benchmark.h>
#include <fcntl.h>
#include <fmt/format.h>
#include <spawn.h>
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <complex>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <map>
#include <memory>
#include <optional>
#include <stdexcept>
#include <string>
#include <vector>

#include "core/parallel.hpp"
#include "fill/assemble.hpp"
#include "geometry/mesh.hpp"
#include "solve/dense.hpp"
#include "wirefield/wirefield.hpp"

extern char** environ;

namespace {

using Clock = std::chrono::steady_clock;

std::string LoadAverage() {
  std::ifstream in("/proc/loadavg");
  std::string a, b, c;
  in >> a >> b >> c;
  return a + " " + b + " " + c;
}

// A straight 40 m wire of n + 1 segments (n unknowns), 1 mm radius, at 14.2 MHz.
std::string LongWireText(int unknowns) {
  return fmt::format(
      "# bench: straight wire, {} unknowns\n"
      "wire w from (0, 0, 10) to (40, 0, 10) radius 1mm segments {}\n"
      "feed f at w@50%\nfrequency 14.2MHz\n",
      unknowns, unknowns + 1);
}

// A 20 m band half-wave dipole of n + 1 segments (n unknowns), 1 mm radius.
std::string DipoleText(int unknowns) {
  return fmt::format(
      "# bench: 20 m band dipole, {} unknowns\nlet len = 10.2m\n"
      "wire top from (-len / 2, 0, 10) to (len / 2, 0, 10) radius 1mm segments {}\n"
      "feed src at top@50%\nfrequency 14.2MHz\n",
      unknowns, unknowns + 1);
}

wirefield::geometry::Mesh MeshOf(const wirefield::Model& m) {
  wirefield::geometry::MeshOptions o;
  o.max_frequency_hz = *m.frequency_hz;
  return wirefield::geometry::BuildMesh(m, o);
}

// Model files for the child process, in a temporary folder removed at exit.
class TempFolder {
 public:
  TempFolder()
      : dir_(std::filesystem::temp_directory_path() /
             fmt::format("wirefield-bench-{}", ::getpid())) {
    std::filesystem::create_directories(dir_);
  }
  ~TempFolder() {
    std::error_code ignored;
    std::filesystem::remove_all(dir_, ignored);
  }
  std::string Write(const std::string& name, const std::string& text) const {
    const std::string path = (dir_ / name).string();
    std::ofstream(path) << text;
    return path;
  }

 private:
  std::filesystem::path dir_;
};

TempFolder& Folder() {
  static TempFolder folder;
  return folder;
}

struct Child {
  double wall_s = 0.0;
  double cpu_s = 0.0;  // user + system time of the child (all its threads)
  double peak_mb = 0.0;
};

// Runs the wirefield program with arguments, stdout to /dev/null; wall and CPU time, and with
// sample_peak its peak memory (polled every 2 ms, which costs the child some CPU and the wall
// clock up to 2 ms: timed runs leave it out).
Child RunProgram(const std::vector<std::string>& args, bool sample_peak) {
  std::vector<std::string> all{WIREFIELD_BINARY};
  all.insert(all.end(), args.begin(), args.end());
  std::vector<char*> argv;
  for (std::string& a : all) argv.push_back(a.data());
  argv.push_back(nullptr);
  posix_spawn_file_actions_t actions;
  posix_spawn_file_actions_init(&actions);
  posix_spawn_file_actions_addopen(&actions, 1, "/dev/null", O_WRONLY, 0);
  posix_spawn_file_actions_addopen(&actions, 2, "/dev/null", O_WRONLY, 0);
  const auto t0 = Clock::now();
  pid_t pid = 0;
  if (posix_spawn(&pid, argv[0], &actions, nullptr, argv.data(), environ) != 0) {
    throw std::runtime_error("cannot start " + all[0]);
  }
  // Peak memory: the child's own high-water mark (VmHWM), sampled until it exits. Not
  // rusage's ru_maxrss: posix_spawn starts the child in this process's address space, so the
  // kernel carries this (large) process's peak over into the child's at exec.
  double peak_kb = 0.0;
  while (sample_peak) {
    siginfo_t info{};
    if (waitid(P_PID, static_cast<id_t>(pid), &info, WEXITED | WNOHANG | WNOWAIT) == 0 &&
        info.si_pid == pid) {
      break;
    }
    std::ifstream status_file(fmt::format("/proc/{}/status", pid));
    std::string line;
    while (std::getline(status_file, line)) {
      if (line.rfind("VmHWM:", 0) == 0) peak_kb = std::max(peak_kb, std::atof(line.c_str() + 6));
    }
    std::this_thread::sleep_for(std::chrono::milliseconds(2));
  }
  int status = 0;
  rusage usage{};
  wait4(pid, &status, 0, &usage);
  posix_spawn_file_actions_destroy(&actions);
  Child c;
  c.wall_s = std::chrono::duration<double>(Clock::now() - t0).count();
  c.peak_mb = peak_kb / 1024.0;
  c.cpu_s = static_cast<double>(usage.ru_utime.tv_sec + usage.ru_stime.tv_sec) +
            1e-6 * static_cast<double>(usage.ru_utime.tv_usec + usage.ru_stime.tv_usec);
  if (!WIFEXITED(status) || WEXITSTATUS(status) != 0) {
    throw std::runtime_error("wirefield failed: " + all[1] + " " + all[2]);
  }
  return c;
}

// The whole program as a benchmark: manual time (the child's wall clock), its CPU time and
// peak memory (from one more run, untimed) as counters.
void RunChild(benchmark::State& state, const std::vector<std::string>& args) {
  // This process's own BLAS workers, idle after the solve rows, would spin on a core for a
  // while and take it from the child measured.
  (void)wirefield::ParkIdleBlasThreads();
  const double peak_mb = RunProgram(args, true).peak_mb;  // one untimed run for the memory
  double cpu_s = 0.0;
  for (auto _ : state) {
    const Child c = RunProgram(args, false);
    state.SetIterationTime(c.wall_s);
    cpu_s += c.cpu_s;
  }
  state.counters["cpu_s"] = benchmark::Counter(cpu_s, benchmark::Counter::kAvgIterations);
  state.counters["peak_MB"] = peak_mb;
}

// The fill's matrix and right-hand side of the last size asked for (the four solves of one
// size share it; one 4000-unknown matrix is 256 MB, so only one is kept).
struct Problem {
  int unknowns = 0;
  Eigen::MatrixXcd z;
  Eigen::VectorXcd v;
};

std::unique_ptr<Problem>& CachedProblem() {
  static std::unique_ptr<Problem> problem;
  return problem;
}

const Problem& ProblemOf(int n) {
  std::unique_ptr<Problem>& p = CachedProblem();
  if (!p || p->unknowns != n) {
    p.reset();
    p = std::make_unique<Problem>();
    const wirefield::Model m = wirefield::ParseModelText(LongWireText(n), "bench.wire");
    const wirefield::geometry::Mesh mesh = MeshOf(m);
    p->unknowns = n;
    p->z = wirefield::fill::AssembleImpedance(mesh, 14.2e6);
    p->v = wirefield::fill::AssembleExcitation(mesh, m);
  }
  return *p;
}

void LapackGesv(const Eigen::MatrixXcd& z, const Eigen::VectorXcd& v) {
  const lapack_int n = static_cast<lapack_int>(z.rows());
  std::vector<lapack_int> pivots(static_cast<size_t>(n));
  Eigen::MatrixXcd a = z;
  Eigen::VectorXcd b = v;
  const lapack_int info =
      LAPACKE_zgesv(LAPACK_COL_MAJOR, n, 1, reinterpret_cast<lapack_complex_double*>(a.data()), n,
                    pivots.data(), reinterpret_cast<lapack_complex_double*>(b.data()), n);
  if (info != 0) throw std::runtime_error("zgesv failed");
  benchmark::DoNotOptimize(b);
}

// The symmetric factorization and solve alone (zsytrf, zsytrs on the lower triangle), timed as
// zgesv is: a copy of the matrix, the factorization, one solve; no condition estimate, no
// checks.
void LapackSytrs(const Eigen::MatrixXcd& z, const Eigen::VectorXcd& v) {
  const lapack_int n = static_cast<lapack_int>(z.rows());
  std::vector<lapack_int> pivots(static_cast<size_t>(n));
  Eigen::MatrixXcd a = z;
  Eigen::VectorXcd b = v;
  auto* pa = reinterpret_cast<lapack_complex_double*>(a.data());
  std::complex<double> size_query = 0.0;
  LAPACKE_zsytrf_work(LAPACK_COL_MAJOR, 'L', n, pa, n, pivots.data(),
                      reinterpret_cast<lapack_complex_double*>(&size_query), -1);
  const lapack_int lwork = std::max<lapack_int>(1, static_cast<lapack_int>(size_query.real()));
  Eigen::VectorXcd work(lwork);
  if (LAPACKE_zsytrf_work(LAPACK_COL_MAJOR, 'L', n, pa, n, pivots.data(),
                          reinterpret_cast<lapack_complex_double*>(work.data()), lwork) != 0 ||
      LAPACKE_zsytrs_work(LAPACK_COL_MAJOR, 'L', n, 1, pa, n, pivots.data(),
                          reinterpret_cast<lapack_complex_double*>(b.data()), n) != 0) {
    throw std::runtime_error("zsytrf/zsytrs failed");
  }
  benchmark::DoNotOptimize(b);
}

// Least-squares slope of log t against log n.
double GrowthExponent(const std::vector<int>& n, const std::vector<double>& t) {
  double sx = 0, sy = 0, sxx = 0, sxy = 0;
  const double m = static_cast<double>(n.size());
  for (size_t i = 0; i < n.size(); ++i) {
    const double x = std::log(n[i]), y = std::log(t[i]);
    sx += x;
    sy += y;
    sxx += x * x;
    sxy += x * y;
  }
  return (m * sxy - sx * sy) / (m * sxx - sx * sx);
}

std::vector<int> Sizes() {
  const char* max_env = std::getenv("WIREFIELD_BENCH_MAX");
  const int max_n = max_env ? std::atoi(max_env) : 4000;
  std::vector<int> sizes;
  for (int n : {100, 250, 500, 1000, 2000, 4000}) {
    if (n <= max_n) sizes.push_back(n);
  }
  return sizes;
}

// Short minimum times: the large sizes run once anyway, and the whole table stays within a
// few minutes.
constexpr double kMinTimeS = 0.2;
// The whole program runs for a second at each size (about ten runs at 1000 unknowns, against
// two at 0.2 s): its time is compared with a target, and single runs of a process vary by a
// tenth on this machine.
constexpr double kProgramMinTimeS = 1.0;

void RegisterAll(const std::vector<int>& sizes) {
  const int cores = wirefield::core::CoreCount();
  // 1. Fill, one thread and all cores: wall time and the process's CPU time.
  for (int n : sizes) {
    for (int threads : {1, cores}) {
      if (threads == cores && cores == 1) continue;
      benchmark::RegisterBenchmark(fmt::format("fill/{}/fill_threads_{}", n, threads).c_str(),
                                   [n, threads](benchmark::State& state) {
                                     const wirefield::Model m =
                                         wirefield::ParseModelText(LongWireText(n), "bench.wire");
                                     const wirefield::geometry::Mesh mesh = MeshOf(m);
                                     const wirefield::fill::NearFieldCache cache =
                                         wirefield::fill::BuildNearFieldCache(mesh);
                                     for (auto _ : state) {
                                       benchmark::DoNotOptimize(wirefield::fill::AssembleImpedance(
                                           mesh, 14.2e6, cache, threads));
                                     }
                                   })
          ->UseRealTime()
          ->MeasureProcessCPUTime()
          ->MinTime(kMinTimeS)
          ->Unit(benchmark::kMillisecond);
    }
  }
  // 2. Dense solve of the fill's matrix, one right-hand side, all cores: LAPACK's zgesv, LU
  // (Eigen on zgetrf), the symmetric zsytrf/zsytrs alone, and ours (SolveDense: symmetry
  // check, zsytrf/zsycon/zsytrs, residual check).
  for (int n : sizes) {
    auto add = [n](const char* name, void (*solve)(const Problem&)) {
      benchmark::RegisterBenchmark(fmt::format("solve_{}/{}", name, n).c_str(),
                                   [n, solve](benchmark::State& state) {
                                     const Problem& p = ProblemOf(n);
                                     for (auto _ : state) solve(p);
                                   })
          ->UseRealTime()
          ->MeasureProcessCPUTime()
          ->MinTime(kMinTimeS)
          ->Unit(benchmark::kMillisecond);
    };
    add("zgesv", [](const Problem& p) { LapackGesv(p.z, p.v); });
    add("lu", [](const Problem& p) {
      Eigen::PartialPivLU<Eigen::MatrixXcd> f(p.z);
      benchmark::DoNotOptimize(f.solve(p.v).eval());
    });
    add("zsytrf", [](const Problem& p) { LapackSytrs(p.z, p.v); });
    add("ours",
        [](const Problem& p) { benchmark::DoNotOptimize(wirefield::solve::SolveDense(p.z, p.v)); });
  }
  // 3. The whole program on one frequency (parse, mesh, cache, fill, solve).
  for (int n : sizes) {
    if (n < 1000 && n != 100) continue;
    benchmark::RegisterBenchmark(fmt::format("program_solve/{}", n).c_str(),
                                 [n](benchmark::State& state) {
                                   CachedProblem().reset();  // this process's memory back
                                   const std::string path = Folder().Write(
                                       fmt::format("wire{}.wire", n), LongWireText(n));
                                   RunChild(state, {"solve", path, "--json"});
                                 })
        ->UseManualTime()
        ->MinTime(kProgramMinTimeS)
        ->Unit(benchmark::kMillisecond);
  }
  // 4. 351-point sweeps (14.00-14.35 MHz in 1 kHz steps), interpolated and exact.
  for (int n : {100, 500}) {
    for (const bool exact : {false, true}) {
      benchmark::RegisterBenchmark(
          fmt::format("program_sweep351/{}/{}", n, exact ? "exact" : "interpolated").c_str(),
          [n, exact](benchmark::State& state) {
            const std::string path = Folder().Write(fmt::format("dipole{}.wire", n), DipoleText(n));
            std::vector<std::string> args{"sweep",    path,     "--from", "14MHz", "--to",
                                          "14.35MHz", "--step", "1kHz",   "--json"};
            if (exact) args.push_back("--exact");
            RunChild(state, args);
          })
          ->UseManualTime()
          ->MinTime(kMinTimeS)
          ->Unit(benchmark::kMillisecond);
    }
  }
  // 5. A 20-row batch through the library: 4 grounds x 5 lengths, each row a 36-point sweep
  // (10 kHz steps) and a pattern, 61 unknowns.
  for (const bool interpolate : {true, false}) {
    benchmark::RegisterBenchmark(
        fmt::format("batch20/{}", interpolate ? "interpolated" : "exact").c_str(),
        [interpolate](benchmark::State& state) {
          wirefield::BatchOptions options;
          for (const char* ground : {"free", "perfect", "average", "very_dry"}) {
            options.grounds.push_back(*wirefield::BatchGroundNamed(ground, "grounds"));
          }
          options.variables.push_back(
              wirefield::BatchVariableFromRange("len", "9.9m", "10.3m", "0.1m"));
          options.spans.push_back(
              {"range", wirefield::FrequencyRange(14.0e6, 14.35e6, 10e3), "10 kHz steps"});
          options.interpolate = interpolate;
          const std::string text = DipoleText(60);
          for (auto _ : state) {
            benchmark::DoNotOptimize(wirefield::RunBatch(text, "batch.wire", options));
          }
        })
        ->UseRealTime()
        ->MeasureProcessCPUTime()
        ->MinTime(kMinTimeS)
        ->Unit(benchmark::kMillisecond);
  }
}

// Google Benchmark's console output, plus the summary table from the same runs at the end.
class TableReporter : public benchmark::ConsoleReporter {
 public:
  struct Result {
    double wall_s = 0.0;  // per iteration (manual time for the whole-program rows)
    double cpu_s = 0.0;   // per iteration: this process's CPU, or the child's (counter)
    double peak_mb = 0.0;
  };

  bool ReportContext(const Context& context) override {
    load_at_start_ = LoadAverage();
    return ConsoleReporter::ReportContext(context);
  }

  void ReportRuns(const std::vector<Run>& runs) override {
    for (const Run& run : runs) {
      if (run.error_occurred || run.run_type != Run::RT_Iteration || run.iterations == 0) {
        continue;
      }
      const double iterations = static_cast<double>(run.iterations);
      Result r;
      r.wall_s = run.real_accumulated_time / iterations;
      r.cpu_s = run.cpu_accumulated_time / iterations;
      if (const auto it = run.counters.find("cpu_s"); it != run.counters.end()) {
        r.cpu_s = it->second.value;
      }
      if (const auto it = run.counters.find("peak_MB"); it != run.counters.end()) {
        r.peak_mb = it->second.value;
      }
      results_[run.run_name.function_name] = r;  // the name registered
    }
    ConsoleReporter::ReportRuns(runs);
  }

  void Finalize() override {
    ConsoleReporter::Finalize();
    PrintTable();
  }

 private:
  std::optional<Result> Find(const std::string& name) const {
    const auto it = results_.find(name);
    if (it == results_.end()) return std::nullopt;
    return it->second;
  }

  void PrintTable() const {
    const int cores = wirefield::core::CoreCount();
    const std::vector<int> sizes = Sizes();
    fmt::print(
        "\nwirefield performance table ({}), from the Google Benchmark runs above: wall clock "
        "per run, CPU where marked (all threads of the process)\n",
        wirefield::Version());
    fmt::print("load average (1, 5, 15 min) at start: {}; at end: {}; {} cores\n\n", load_at_start_,
               LoadAverage(), cores);

    fmt::print("1. Matrix fill (straight wire, 14.2 MHz), time per matrix entry\n");
    fmt::print("{:>9} {:>12} {:>12} {:>14} {:>9} {:>15}\n", "unknowns", "1 thread", "all cores",
               "per core (all)", "speed-up", "CPU/wall (all)");
    std::vector<int> fit_n;
    std::vector<double> fit_fill, fit_solve;
    for (int n : sizes) {
      const auto one = Find(fmt::format("fill/{}/fill_threads_1", n));
      const auto all = cores > 1 ? Find(fmt::format("fill/{}/fill_threads_{}", n, cores)) : one;
      if (!one || !all) continue;
      const double entries = static_cast<double>(n) * n;
      fmt::print("{:>9} {:>9.0f} ns {:>9.0f} ns {:>11.0f} ns {:>8.2f}x {:>14.2f}\n", n,
                 one->wall_s / entries * 1e9, all->wall_s / entries * 1e9,
                 all->wall_s * cores / entries * 1e9, one->wall_s / all->wall_s,
                 all->cpu_s / all->wall_s);
      const auto ours = Find(fmt::format("solve_ours/{}", n));
      if (n >= 250 && ours) {  // fixed costs dominate below
        fit_n.push_back(n);
        fit_fill.push_back(all->wall_s);
        fit_solve.push_back(ours->wall_s);
      }
    }

    fmt::print("\n2. Dense solve of the fill's matrix, one right-hand side (all cores)\n");
    fmt::print("{:>9} {:>11} {:>11} {:>11} {:>11} {:>12} {:>11}\n", "unknowns", "zgesv",
               "LU(zgetrf)", "zsytrf+trs", "ours", "zsytrf/zgesv", "ours/zgesv");
    for (int n : sizes) {
      const auto gesv = Find(fmt::format("solve_zgesv/{}", n));
      const auto lu = Find(fmt::format("solve_lu/{}", n));
      const auto sym = Find(fmt::format("solve_zsytrf/{}", n));
      const auto ours = Find(fmt::format("solve_ours/{}", n));
      if (!gesv || !lu || !sym || !ours) continue;
      const int digits = gesv->wall_s < 0.01 ? 3 : 1;
      fmt::print(
          "{:>9} {:>8.{}f} ms {:>8.{}f} ms {:>8.{}f} ms {:>8.{}f} ms {:>11.2f}x {:>10.2f}x\n", n,
          gesv->wall_s * 1e3, digits, lu->wall_s * 1e3, digits, sym->wall_s * 1e3, digits,
          ours->wall_s * 1e3, digits, sym->wall_s / gesv->wall_s, ours->wall_s / gesv->wall_s);
    }
    fmt::print(
        "   zsytrf+trs = the symmetric factorization and one solve alone, timed as zgesv is (with\n"
        "   a copy of the matrix); ours = SolveDense: symmetric-matrix check + zsytrf + the\n"
        "   condition estimate zsycon (about ten sequential O(n^2) solves) + zsytrs + residual\n"
        "   check\n");

    if (fit_n.size() >= 2) {
      fmt::print("\n3. Growth exponents, least squares of log t against log n over {}..{}:\n",
                 fit_n.front(), fit_n.back());
      fmt::print("   fill t ~ n^{:.2f} (expected 2), solve t ~ n^{:.2f} (expected 3)\n",
                 GrowthExponent(fit_n, fit_fill), GrowthExponent(fit_n, fit_solve));
    }

    fmt::print("\n4. Whole program, `wirefield solve MODEL --json` (parse, mesh, fill, solve)\n");
    fmt::print("{:>9} {:>11} {:>11} {:>13}\n", "unknowns", "wall", "CPU", "peak memory");
    for (int n : sizes) {
      const auto c = Find(fmt::format("program_solve/{}", n));
      if (!c) continue;
      fmt::print("{:>9} {:>8.3f} s {:>8.3f} s {:>10.0f} MB\n", n, c->wall_s, c->cpu_s, c->peak_mb);
      const auto gesv = Find(fmt::format("solve_zgesv/{}", n));
      if (n == 1000 && gesv) {
        fmt::print("   1000 unknowns: whole process {:.2f}x the time of zgesv alone ({:.1f} ms)\n",
                   c->wall_s / gesv->wall_s, gesv->wall_s * 1e3);
      }
      if (n == 4000) {
        fmt::print("   4000 unknowns: one matrix is {:.0f} MB (16 bytes per entry)\n",
                   4000.0 * 4000.0 * 16.0 / (1024.0 * 1024.0));
      }
    }

    fmt::print("\n5. 351-point sweep (14.00-14.35 MHz, 1 kHz steps), whole program\n");
    fmt::print("{:>9} {:>14} {:>11} {:>9} {:>14} {:>11}\n", "unknowns", "interpolated", "exact",
               "speed-up", "CPU interp.", "CPU exact");
    for (int n : {100, 500}) {
      const auto fast = Find(fmt::format("program_sweep351/{}/interpolated", n));
      const auto exact = Find(fmt::format("program_sweep351/{}/exact", n));
      if (!fast || !exact) continue;
      fmt::print("{:>9} {:>12.3f} s {:>8.3f} s {:>8.1f}x {:>12.3f} s {:>8.3f} s\n", n, fast->wall_s,
                 exact->wall_s, exact->wall_s / fast->wall_s, fast->cpu_s, exact->cpu_s);
    }

    const auto fast = Find("batch20/interpolated");
    const auto exact = Find("batch20/exact");
    if (fast && exact) {
      fmt::print(
          "\n6. Batch of 20 rows (4 grounds x 5 lengths; each row a 36-point sweep and a "
          "pattern, 61 unknowns), library call\n");
      fmt::print(
          "   {:.3f} s interpolated (CPU {:.3f} s), {:.3f} s exact (CPU {:.3f} s): {:.1f}x\n",
          fast->wall_s, fast->cpu_s, exact->wall_s, exact->cpu_s, exact->wall_s / fast->wall_s);
    }
  }

  std::map<std::string, Result> results_;
  std::string load_at_start_;
};

}  // namespace

int main(int argc, char** argv) {
  benchmark::Initialize(&argc, argv);
  if (benchmark::ReportUnrecognizedArguments(argc, argv)) return 1;
  RegisterAll(Sizes());
  TableReporter reporter;
  benchmark::RunSpecifiedBenchmarks(&reporter);
  benchmark::Shutdown();
  return 0;
}
