// Benchmarks (make bench): one run that measures where wirefield spends its time and prints
// the summary table of docs/performance.md: matrix fill per entry, dense solve against LAPACK
// on the same matrices, the whole program on one frequency, 351-point sweeps interpolated and
// exact, a 20-row batch, growth exponents and the peak memory of a 4000-unknown solve.
// Whole-program rows run build/bin/wirefield as a child process (models written to a temp
// folder); library rows call libmom directly. Sizes via WIREFIELD_BENCH_MAX (default 4000).
#include <fcntl.h>
#include <fmt/format.h>
#include <spawn.h>
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <chrono>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <functional>
#include <stdexcept>
#include <string>
#include <thread>
#include <vector>

#include "fill/assemble.hpp"
#include "geometry/mesh.hpp"
#include "solve/dense.hpp"
#include "wirefield/wirefield.hpp"

extern char** environ;

namespace {

using Clock = std::chrono::steady_clock;

// The shortest of `repetitions` runs (the least disturbed by other work on the machine).
double Time(int repetitions, const std::function<void()>& run) {
  double best = 1e300;
  for (int r = 0; r < repetitions; ++r) {
    const auto t0 = Clock::now();
    run();
    best = std::min(best, std::chrono::duration<double>(Clock::now() - t0).count());
  }
  return best;
}

int RepetitionsFor(int n) { return n <= 250 ? 7 : n <= 1000 ? 3 : 1; }

std::string LoadAverage() {
  std::ifstream in("/proc/loadavg");
  std::string a, b, c;
  in >> a >> b >> c;
  return a + " " + b + " " + c;
}

std::string CpuModel() {
  std::ifstream in("/proc/cpuinfo");
  std::string line;
  while (std::getline(in, line)) {
    if (line.rfind("model name", 0) == 0) return line.substr(line.find(':') + 2);
  }
  return "unknown";
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

struct Child {
  double wall_s = 0.0;
  double cpu_s = 0.0;  // user + system time of the child (all its threads)
  double max_rss_mb = 0.0;
};

// Runs the wirefield program with arguments, stdout to /dev/null; wall time and peak memory.
Child RunProgram(const std::vector<std::string>& args) {
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
  for (;;) {
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
  c.max_rss_mb = peak_kb / 1024.0;
  c.cpu_s = static_cast<double>(usage.ru_utime.tv_sec + usage.ru_stime.tv_sec) +
            1e-6 * static_cast<double>(usage.ru_utime.tv_usec + usage.ru_stime.tv_usec);
  if (!WIFEXITED(status) || WEXITSTATUS(status) != 0) {
    throw std::runtime_error("wirefield failed: " + all[1] + " " + all[2]);
  }
  return c;
}

Child BestOf(int repetitions, const std::vector<std::string>& args) {
  Child best{1e300, 1e300, 0.0};
  for (int r = 0; r < repetitions; ++r) {
    const Child c = RunProgram(args);
    best.wall_s = std::min(best.wall_s, c.wall_s);
    best.cpu_s = std::min(best.cpu_s, c.cpu_s);
    best.max_rss_mb = std::max(best.max_rss_mb, c.max_rss_mb);
  }
  return best;
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

wirefield::geometry::Mesh MeshOf(const wirefield::Model& m) {
  wirefield::geometry::MeshOptions o;
  o.max_frequency_hz = *m.frequency_hz;
  return wirefield::geometry::BuildMesh(m, o);
}

double LapackGesv(const Eigen::MatrixXcd& z, const Eigen::VectorXcd& v) {
  const lapack_int n = static_cast<lapack_int>(z.rows());
  std::vector<lapack_int> pivots(static_cast<size_t>(n));
  Eigen::MatrixXcd a = z;
  Eigen::VectorXcd b = v;
  const lapack_int info =
      LAPACKE_zgesv(LAPACK_COL_MAJOR, n, 1, reinterpret_cast<lapack_complex_double*>(a.data()), n,
                    pivots.data(), reinterpret_cast<lapack_complex_double*>(b.data()), n);
  if (info != 0) throw std::runtime_error("zgesv failed");
  return std::abs(b(0));
}

}  // namespace

int main() {
  const char* max_env = std::getenv("WIREFIELD_BENCH_MAX");
  const int max_n = max_env ? std::atoi(max_env) : 4000;
  std::vector<int> sizes;
  for (int n : {100, 250, 500, 1000, 2000, 4000}) {
    if (n <= max_n) sizes.push_back(n);
  }
  const auto start = Clock::now();
  const std::filesystem::path dir =
      std::filesystem::temp_directory_path() / fmt::format("wirefield-bench-{}", ::getpid());
  std::filesystem::create_directories(dir);
  auto write = [&](const std::string& name, const std::string& text) {
    const std::string path = (dir / name).string();
    std::ofstream(path) << text;
    return path;
  };

  fmt::print(
      "wirefield performance table ({}); times are the best of a few runs, wall clock "
      "unless marked CPU\n",
      wirefield::Version());
  fmt::print("machine: {} cores, {}\n", std::thread::hardware_concurrency(), CpuModel());
  fmt::print("load average at start (1, 5, 15 min): {}\n\n", LoadAverage());

  // 1. Fill: time per matrix entry, one thread and all cores.
  fmt::print("1. Matrix fill (straight wire, 14.2 MHz), time per matrix entry\n");
  fmt::print("{:>9} {:>12} {:>12} {:>14} {:>9}\n", "unknowns", "1 thread", "all cores",
             "per core (all)", "speed-up");
  std::vector<double> fill_s;
  for (int n : sizes) {
    const wirefield::Model m = wirefield::ParseModelText(LongWireText(n), "bench.wire");
    const wirefield::geometry::Mesh mesh = MeshOf(m);
    const wirefield::fill::NearFieldCache cache = wirefield::fill::BuildNearFieldCache(mesh);
    const int cores = static_cast<int>(std::max(1u, std::thread::hardware_concurrency()));
    const int reps = RepetitionsFor(n);
    const double one =
        Time(reps, [&] { (void)wirefield::fill::AssembleImpedance(mesh, 14.2e6, cache, 1); });
    const double all =
        Time(reps, [&] { (void)wirefield::fill::AssembleImpedance(mesh, 14.2e6, cache, cores); });
    fill_s.push_back(all);
    const double entries = static_cast<double>(n) * n;
    fmt::print("{:>9} {:>9.0f} ns {:>9.0f} ns {:>11.0f} ns {:>8.2f}x\n", n, one / entries * 1e9,
               all / entries * 1e9, all * cores / entries * 1e9, one / all);
  }

  // 2. Dense solve of the same matrices: ours against LAPACK.
  fmt::print("\n2. Dense solve of the fill's matrix, one right-hand side (all cores)\n");
  fmt::print("{:>9} {:>11} {:>11} {:>11} {:>11} {:>12}\n", "unknowns", "zgesv", "LU(zgetrf)",
             "zsytrf+trs", "ours", "ours/zgesv");
  std::vector<double> solve_s, gesv_times;
  for (int n : sizes) {
    const wirefield::Model m = wirefield::ParseModelText(LongWireText(n), "bench.wire");
    const wirefield::geometry::Mesh mesh = MeshOf(m);
    const Eigen::MatrixXcd z = wirefield::fill::AssembleImpedance(mesh, 14.2e6);
    const Eigen::VectorXcd v = wirefield::fill::AssembleExcitation(mesh, m);
    const int reps = RepetitionsFor(n);
    const double gesv = Time(reps, [&] { (void)LapackGesv(z, v); });
    const double lu = Time(reps, [&] {
      Eigen::PartialPivLU<Eigen::MatrixXcd> f(z);
      (void)f.solve(v);
    });
    const double sym = Time(reps, [&] { (void)wirefield::solve::SolveSymmetric(z, v); });
    const double ours = Time(reps, [&] { (void)wirefield::solve::SolveDense(z, v); });
    solve_s.push_back(ours);
    gesv_times.push_back(gesv);
    fmt::print("{:>9} {:>8.1f} ms {:>8.1f} ms {:>8.1f} ms {:>8.1f} ms {:>11.2f}x\n", n, gesv * 1e3,
               lu * 1e3, sym * 1e3, ours * 1e3, ours / gesv);
  }
  fmt::print("   ours = symmetric-matrix check + zsytrf/zsycon/zsytrs + residual check\n");

  // 3. Fitted growth exponents.
  std::vector<int> fit_n;
  std::vector<double> fit_fill, fit_solve;
  for (size_t i = 0; i < sizes.size(); ++i) {
    if (sizes[i] < 250) continue;  // fixed costs dominate below
    fit_n.push_back(sizes[i]);
    fit_fill.push_back(fill_s[i]);
    fit_solve.push_back(solve_s[i]);
  }
  if (fit_n.size() >= 2) {
    fmt::print("\n3. Growth exponents, least squares of log t against log n over {}..{}:\n",
               fit_n.front(), fit_n.back());
    fmt::print("   fill t ~ n^{:.2f} (expected 2), solve t ~ n^{:.2f} (expected 3)\n",
               GrowthExponent(fit_n, fit_fill), GrowthExponent(fit_n, fit_solve));
  }

  // 4. The whole program on one frequency, and at 1000 unknowns against LAPACK's zgesv alone
  // (factor and solve of a matrix of that size, all cores).
  fmt::print("\n4. Whole program, `wirefield solve MODEL --json` (parse, mesh, fill, solve)\n");
  fmt::print("{:>9} {:>11} {:>11} {:>13}\n", "unknowns", "wall", "CPU", "peak memory");
  for (int n : sizes) {
    if (n < 1000 && n != 100) continue;
    const std::string path = write(fmt::format("wire{}.wire", n), LongWireText(n));
    const Child c = BestOf(n <= 1000 ? 3 : 1, {"solve", path, "--json"});
    fmt::print("{:>9} {:>8.3f} s {:>8.3f} s {:>10.0f} MB\n", n, c.wall_s, c.cpu_s, c.max_rss_mb);
    const auto at = std::find(sizes.begin(), sizes.end(), n);
    if (n == 1000 && at != sizes.end()) {
      const double gesv_s = gesv_times[static_cast<size_t>(at - sizes.begin())];
      fmt::print("   1000 unknowns: whole process {:.2f}x the time of zgesv alone ({:.1f} ms)\n",
                 c.wall_s / gesv_s, gesv_s * 1e3);
    }
    if (n == 4000) {
      fmt::print("   4000 unknowns: one matrix is {:.0f} MB (16 bytes per entry)\n",
                 4000.0 * 4000.0 * 16.0 / (1024.0 * 1024.0));
    }
  }

  // 5. 351-point sweeps, interpolated and exact, whole program.
  fmt::print("\n5. 351-point sweep (14.00-14.35 MHz, 1 kHz steps), whole program\n");
  fmt::print("{:>9} {:>14} {:>11} {:>9} {:>14} {:>11}\n", "unknowns", "interpolated", "exact",
             "speed-up", "CPU interp.", "CPU exact");
  for (int n : {100, 500}) {
    const std::string path = write(fmt::format("dipole{}.wire", n), DipoleText(n));
    const std::vector<std::string> args{"sweep",    path,     "--from", "14MHz", "--to",
                                        "14.35MHz", "--step", "1kHz",   "--json"};
    std::vector<std::string> exact_args = args;
    exact_args.push_back("--exact");
    const Child fast = BestOf(n <= 100 ? 3 : 1, args);
    const Child exact = BestOf(1, exact_args);
    fmt::print("{:>9} {:>12.3f} s {:>8.3f} s {:>8.1f}x {:>12.3f} s {:>8.3f} s\n", n, fast.wall_s,
               exact.wall_s, exact.wall_s / fast.wall_s, fast.cpu_s, exact.cpu_s);
  }

  // 6. A 20-row batch through the library: 4 grounds x 5 lengths, each row a 36-point sweep
  // and a pattern.
  fmt::print(
      "\n6. Batch of 20 rows (4 grounds x 5 lengths; each row a 36-point sweep and a "
      "2-degree pattern), library call\n");
  {
    wirefield::BatchOptions options;
    options.grounds = wirefield::ParseGroundList("free,perfect,average,very_dry");
    options.variables.push_back(wirefield::ParseVary("len=9.9m:10.3m:0.1m"));
    options.spans.push_back(
        {"range", wirefield::FrequencyRange(14.0e6, 14.35e6, 10e3), "10 kHz steps"});
    const std::string text = DipoleText(60);
    double rows = 0.0;
    const double fast = Time(1, [&] {
      rows = static_cast<double>(wirefield::RunBatch(text, "batch.wire", options).rows.size());
    });
    options.interpolate = false;
    const double exact = Time(1, [&] { (void)wirefield::RunBatch(text, "batch.wire", options); });
    fmt::print("   {:.0f} rows, 61 unknowns: {:.3f} s interpolated, {:.3f} s exact ({:.1f}x)\n",
               rows, fast, exact, exact / fast);
  }

  std::filesystem::remove_all(dir);
  fmt::print("\nload average at end (1, 5, 15 min): {}\n", LoadAverage());
  fmt::print("total bench time: {:.0f} s\n",
             std::chrono::duration<double>(Clock::now() - start).count());
  return 0;
}
