// All-or-nothing output: unique temporaries, renamed into place when every one is complete.
#include "core/atomic_file.h"

#include <fcntl.h>
#include <sys/stat.h>
#include <signal.h>
#include <unistd.h>

#include <atomic>
#include <cerrno>
#include <climits>
#include <csignal>
#include <cstdlib>
#include <cstring>
#include <filesystem>

#include "core/error.h"

namespace edgeflux {

namespace {

namespace fs = std::filesystem;

// The temporaries of the files being written, for the signal handler: fixed storage, because a
// handler may only call async-signal-safe functions (unlink) and must not allocate.
constexpr int max_registered = 256;
char registered[max_registered][PATH_MAX];
std::atomic<int> n_registered{0};

extern "C" void remove_temporaries_and_die(int signal_number) {
  const int n = n_registered.load();
  for (int i = 0; i < n && i < max_registered; ++i)
    if (registered[i][0] != '\0') ::unlink(registered[i]);
  ::signal(signal_number, SIG_DFL);
  ::raise(signal_number);
}

void install_handlers_once() {
  static const bool installed = [] {
    struct sigaction action {};
    action.sa_handler = remove_temporaries_and_die;
    sigemptyset(&action.sa_mask);
    for (int signal_number : {SIGINT, SIGTERM, SIGHUP, SIGQUIT}) ::sigaction(signal_number, &action, nullptr);
    return true;
  }();
  (void)installed;
}

/// Where a file for `path` really goes: the file a symlink points to (through a chain of links,
/// even to a file that does not exist yet), else the path itself.
fs::path final_target(fs::path path) {
  std::error_code ec;
  for (int hops = 0; hops < 40 && fs::is_symlink(fs::symlink_status(path, ec)); ++hops) {
    const fs::path next = fs::read_symlink(path, ec);
    if (ec) break;
    path = next.is_absolute() ? next : path.parent_path() / next;
  }
  return path;
}

/// The temporaries written so far; removed (and unregistered) unless released.
class Temporaries {
 public:
  ~Temporaries() {
    for (const fs::path& p : paths_) {
      std::error_code ec;
      if (!p.empty()) fs::remove(p, ec);
    }
    n_registered.store(0);
  }
  void add(const fs::path& p) {
    paths_.push_back(p);
    const int slot = n_registered.load();
    if (slot < max_registered) {
      std::strncpy(registered[slot], p.c_str(), PATH_MAX - 1);
      registered[slot][PATH_MAX - 1] = '\0';
      n_registered.store(slot + 1);
    }
  }
  const fs::path& path(std::size_t k) const { return paths_[k]; }
  void renamed(std::size_t k) { paths_[k].clear(); }

 private:
  std::vector<fs::path> paths_;
};

/// Temporaries of `target` left by runs that were killed outright (kill -9, power loss): their
/// names carry the writer's process id; a process that no longer exists will not finish them.
void remove_stale_temporaries(const fs::path& folder, const fs::path& target) {
  const std::string prefix = "." + target.filename().string() + ".partial-";
  std::error_code ec;
  for (fs::directory_iterator it(folder, ec), end; !ec && it != end; it.increment(ec)) {
    const std::string name = it->path().filename().string();
    if (name.rfind(prefix, 0) != 0) continue;
    const std::string rest = name.substr(prefix.size());
    const std::size_t dash = rest.find('-');
    if (dash == std::string::npos || dash == 0 || rest.find_first_not_of("0123456789") != dash) continue;
    const long pid = std::strtol(rest.substr(0, dash).c_str(), nullptr, 10);
    if (pid > 0 && pid != ::getpid() && ::kill(static_cast<pid_t>(pid), 0) != 0 && errno == ESRCH) {
      std::error_code ignored;
      fs::remove(it->path(), ignored);
    }
  }
}

}  // namespace

void write_files_atomically(const std::vector<FileToWrite>& files) {
  install_handlers_once();
  // mkstemp creates files only the owner can read; outputs get the permissions a new file would.
  const mode_t mask = ::umask(0);
  ::umask(mask);
  Temporaries temporaries;
  std::vector<fs::path> targets;
  for (const FileToWrite& f : files) {
    const fs::path target = final_target(fs::path(f.path));
    const fs::path folder = target.has_parent_path() ? target.parent_path() : fs::path(".");
    std::error_code ec;
    if (!fs::is_directory(folder, ec))
      throw_input_error({f.path, 0}, "output file", "the folder \"" + folder.string() + "\" does not exist",
                        "create the folder first or choose another path");
    remove_stale_temporaries(folder, target);
    // A unique name per process and file: two runs writing the same output never share it; the
    // process id lets a later run recognise a temporary whose writer was killed.
    std::string name = (folder / ("." + target.filename().string() + ".partial-" + std::to_string(::getpid()) + "-XXXXXX")).string();
    const int fd = ::mkstemp(name.data());
    if (fd < 0)
      throw_input_error({f.path, 0}, "output file", std::string("cannot be written (") + std::strerror(errno) + ")",
                        "choose a folder you can write to");
    temporaries.add(name);
    const char* data = f.content.data();
    std::size_t left = f.content.size();
    bool ok = true;
    while (left > 0) {
      const ssize_t n = ::write(fd, data, left);
      if (n < 0 && errno == EINTR) continue;
      if (n <= 0) {
        ok = false;
        break;
      }
      data += n, left -= static_cast<std::size_t>(n);
    }
    ok = ok && ::fchmod(fd, 0666 & ~mask) == 0 && ::fsync(fd) == 0;
    const int saved = errno;
    ok = (::close(fd) == 0) && ok;
    if (!ok)
      throw_input_error({f.path, 0}, "output file", std::string("writing failed (") + std::strerror(saved ? saved : errno) + ")",
                        "free space on the disk or choose another folder; no output file was changed");
    targets.push_back(target);
  }
  // Every file is complete: now they replace the old ones.
  for (std::size_t k = 0; k < files.size(); ++k) {
    std::error_code ec;
    fs::rename(temporaries.path(k), targets[k], ec);
    if (ec)
      throw_input_error({files[k].path, 0}, "output file", "cannot replace the file (" + ec.message() + ")",
                        "check the permissions of the folder");
    temporaries.renamed(k);
  }
}

}  // namespace edgeflux
