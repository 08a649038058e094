#include "gapmark/output_file.hpp"

#include <fcntl.h>
#include <sys/file.h>
#include <sys/random.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <ctime>
#include <vector>
#include <ostream>
#include <streambuf>

#include "gapmark/error.hpp"

namespace gapmark {
namespace fs = std::filesystem;

namespace {

std::string errno_text(int error) { return std::strerror(error); }

/// Eight random hex digits from the kernel's generator.
std::string random_suffix() {
  unsigned char bytes[4] = {0, 0, 0, 0};
  std::size_t got = 0;
  while (got < sizeof bytes) {
    const ssize_t n = ::getrandom(bytes + got, sizeof bytes - got, 0);
    if (n < 0) {
      if (errno == EINTR) continue;
      break;  // fall back on the clock and the address below
    }
    got += static_cast<std::size_t>(n);
  }
  unsigned value = 0;
  for (unsigned char b : bytes) value = value << 8 | b;
  if (got < sizeof bytes) value ^= static_cast<unsigned>(::clock()) ^ static_cast<unsigned>(::getpid()) * 2654435761u;
  char text[16];
  std::snprintf(text, sizeof text, "%08x", value);
  return text;
}

/// What kind of thing is at `path` (not following a final link), or
/// nothing. Errors other than "absent" throw.
bool lstat_of(const fs::path& path, struct stat& st) {
  if (::lstat(path.c_str(), &st) == 0) return true;
  if (errno == ENOENT || errno == ENOTDIR) return false;
  throw InputError(path.string(), "cannot check the output path: " + errno_text(errno));
}

std::string kind_of(mode_t mode) {
  if (S_ISLNK(mode)) return "a symbolic link";
  if (S_ISDIR(mode)) return "a folder";
  if (S_ISCHR(mode) || S_ISBLK(mode)) return "a device";
  if (S_ISFIFO(mode)) return "a FIFO";
  if (S_ISSOCK(mode)) return "a socket";
  return "not a regular file";
}

/// The refusal for something that is not a plain file at an output path.
void refuse_non_regular(const fs::path& path, mode_t mode) {
  if (S_ISREG(mode)) return;
  if (S_ISLNK(mode))
    throw InputError(path.string(), "is a symbolic link; gapmark never writes through a link (name the file it "
                                    "points to, or remove the link)");
  throw InputError(path.string(), "is " + kind_of(mode) + ", not a regular file; gapmark writes only regular files");
}

bool is_inside(const fs::path& inner, const fs::path& outer) {
  auto i = inner.begin();
  for (auto o = outer.begin(); o != outer.end(); ++o, ++i) {
    if (o->empty()) continue;  // a trailing separator
    if (i == inner.end() || *i != *o) return false;
  }
  return true;
}

fs::path canonical_or_lexical(const fs::path& path) {
  std::error_code ec;
  fs::path p = fs::weakly_canonical(fs::absolute(path, ec), ec);
  if (ec) p = fs::absolute(path, ec).lexically_normal();
  return p;
}

}  // namespace

void check_output_file(const fs::path& path, bool force) {
  struct stat st {};
  if (!lstat_of(path, st)) return;
  refuse_non_regular(path, st.st_mode);
  if (!force) throw InputError(path.string(), "exists already; give --force to replace it");
}

void check_output_folder(const fs::path& dir) {
  struct stat st {};
  if (::stat(dir.c_str(), &st) != 0) {
    if (errno == ENOENT) {
      struct stat link {};
      if (::lstat(dir.c_str(), &link) == 0)
        throw InputError(dir.string(), "is a symbolic link to nothing; create its target folder or give another one");
      return;
    }
    throw InputError(dir.string(), "cannot create the output folder: " + errno_text(errno));
  }
  if (!S_ISDIR(st.st_mode))
    throw InputError(dir.string(), "is " + kind_of(st.st_mode) + ", not a folder; give a folder for the output");
}

void check_folder_holds_no_input(const fs::path& dir, const std::vector<fs::path>& inputs, const std::string& hint) {
  const fs::path out = canonical_or_lexical(dir);
  for (const auto& input : inputs) {
    const fs::path in = canonical_or_lexical(input);
    if (is_inside(in, out))
      throw InputError(dir.string(), "the output folder holds an input of the run, " + input.string() +
                                         ", which the outputs could overwrite; " + hint);
  }
}

void check_file_is_no_input(const fs::path& path, const std::vector<fs::path>& inputs) {
  for (const auto& input : inputs) {
    std::error_code ec;
    if (fs::equivalent(path, input, ec) && !ec)
      throw InputError(path.string(), "is an input of this command (" + input.string() +
                                          "); write the output to another file");
  }
}

// ---------------------------------------------------------------- TempFile

TempFile::TempFile(const fs::path& target) : target_(target) {
  const fs::path parent = target.parent_path();
  if (!parent.empty()) {
    std::error_code ec;
    fs::create_directories(parent, ec);
    if (ec) throw InputError(target.string(), "cannot create folder " + parent.string() + ": " + ec.message());
  }
  const std::string name = target.filename().string();
  for (int attempt = 0; attempt < 100; ++attempt) {
    fs::path candidate = target;
    candidate.replace_filename(name + kTempMarker + random_suffix());
    const int fd = ::open(candidate.c_str(), O_WRONLY | O_CREAT | O_EXCL | O_NOFOLLOW | O_CLOEXEC, 0666);
    if (fd >= 0) {
      fd_ = fd;
      path_ = std::move(candidate);
      return;
    }
    if (errno != EEXIST) throw InputError(target.string(), "cannot write: " + errno_text(errno));
  }
  throw InputError(target.string(), "cannot create a temporary file beside it (100 names taken)");
}

TempFile::~TempFile() {
  if (fd_ >= 0) ::close(fd_);
  if (owned_ && !path_.empty()) ::unlink(path_.c_str());
}

void TempFile::write(std::string_view text) {
  std::size_t written = 0;
  while (written < text.size()) {
    const ssize_t n = ::write(fd_, text.data() + written, text.size() - written);
    if (n < 0) {
      if (errno == EINTR) continue;
      throw InputError(target_.string(), "cannot write: " + errno_text(errno));
    }
    written += static_cast<std::size_t>(n);
  }
}

namespace {
/// A write-only stream buffer over a file descriptor (1 MiB buffer); a
/// failed write is kept in `error` and makes the stream bad.
class FdBuffer final : public std::streambuf {
public:
  explicit FdBuffer(int fd) : fd_(fd), buffer_(1 << 20) { setp(buffer_.data(), buffer_.data() + buffer_.size()); }
  int error = 0;

protected:
  int_type overflow(int_type c) override {
    if (flush() != 0) return traits_type::eof();
    if (!traits_type::eq_int_type(c, traits_type::eof())) {
      *pptr() = traits_type::to_char_type(c);
      pbump(1);
    }
    return traits_type::not_eof(c);
  }
  int sync() override { return flush(); }

private:
  int flush() {
    const char* p = pbase();
    while (p < pptr()) {
      const ssize_t n = ::write(fd_, p, static_cast<std::size_t>(pptr() - p));
      if (n < 0) {
        if (errno == EINTR) continue;
        error = errno;
        return -1;
      }
      p += n;
    }
    setp(buffer_.data(), buffer_.data() + buffer_.size());
    return 0;
  }
  int fd_;
  std::vector<char> buffer_;
};
}  // namespace

void TempFile::write_with(const std::function<void(std::ostream&)>& fill) {
  FdBuffer buffer(fd_);
  std::ostream out(&buffer);
  fill(out);
  out.flush();
  if (!out || buffer.error)
    throw InputError(target_.string(), "cannot write: " + errno_text(buffer.error ? buffer.error : EIO));
}

void TempFile::close() {
  if (fd_ < 0) return;
  // Flush to disk where the file system supports it; some do not (EINVAL).
  const int fd = fd_;
  fd_ = -1;
  if (::fsync(fd) != 0 && errno != EINVAL && errno != EROFS) {
    const int error = errno;
    ::close(fd);
    throw InputError(target_.string(), "cannot write: " + errno_text(error));
  }
  if (::close(fd) != 0) throw InputError(target_.string(), "cannot write: " + errno_text(errno));
}

void TempFile::commit() {
  close();
  rename_over(path_, target_);
  owned_ = false;
}

fs::path TempFile::release() {
  close();
  owned_ = false;
  return path_;
}

void rename_over(const fs::path& temp, const fs::path& target) {
  struct stat st {};
  if (lstat_of(target, st)) refuse_non_regular(target, st.st_mode);
  if (std::rename(temp.c_str(), target.c_str()) != 0)
    throw InputError(target.string(), "cannot replace the file: " + errno_text(errno));
}

std::size_t remove_stale_temp_files(const fs::path& dir) {
  std::size_t removed = 0;
  std::error_code ec;
  for (fs::directory_iterator it(dir, ec), end; !ec && it != end; it.increment(ec)) {
    const std::string name = it->path().filename().string();
    if (name.find(kTempMarker) == std::string::npos) continue;
    if (::unlink(it->path().c_str()) == 0) ++removed;
  }
  return removed;
}

// ---------------------------------------------------------------- FolderLock

FolderLock::FolderLock(const fs::path& dir) {
  const fs::path path = dir / kLockFile;
  fd_ = ::open(path.c_str(), O_RDWR | O_CREAT | O_NOFOLLOW | O_CLOEXEC, 0666);
  if (fd_ < 0)
    throw InputError(path.string(), (errno == ELOOP ? std::string("is a symbolic link; remove it")
                                                    : "cannot open the folder's lock file: " + errno_text(errno)));
  struct stat st {};
  if (::fstat(fd_, &st) != 0 || !S_ISREG(st.st_mode)) {
    ::close(fd_);
    throw InputError(path.string(), "is not a regular file; remove it");
  }
  if (::flock(fd_, LOCK_EX | LOCK_NB) != 0) {
    const int error = errno;
    char text[32] = {0};
    const ssize_t n = ::pread(fd_, text, sizeof text - 1, 0);
    ::close(fd_);
    fd_ = -1;
    if (error != EWOULDBLOCK) throw InputError(path.string(), "cannot lock the output folder: " + errno_text(error));
    std::string holder = n > 0 ? std::string(text, static_cast<std::size_t>(n)) : std::string();
    while (!holder.empty() && (holder.back() == '\n' || holder.back() == ' ')) holder.pop_back();
    if (holder.empty() || holder.find_first_not_of("0123456789") != std::string::npos) holder = "?";
    throw InputError(dir.string(), "in use by another gapmark process (pid " + holder +
                                       "); wait until it ends, or give another output folder");
  }
  const std::string pid = std::to_string(::getpid()) + "\n";
  if (::ftruncate(fd_, 0) == 0) {
    const ssize_t n = ::pwrite(fd_, pid.data(), pid.size(), 0);
    (void)n;  // the pid is for messages only
  }
}

FolderLock::~FolderLock() {
  if (fd_ >= 0) ::close(fd_);
}

}  // namespace gapmark
