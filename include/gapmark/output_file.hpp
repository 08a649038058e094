#pragma once
// Writing files safely, in one place. Every file gapmark writes goes through
// a temporary file created here and a rename, and every output path the user
// names is checked here first. The rules (README, "Outputs"):
//  - gapmark writes only regular files: an output path that exists and is a
//    device, FIFO, socket or a symbolic link is refused, with or without
//    --force (a symbolic link is never followed for writing: name the file it
//    points to). An output *folder* may be a symbolic link to a folder;
//  - an existing output is replaced only with --force (the caller decides);
//  - temporary files are created beside the target under an unpredictable
//    name, "NAME.gapmark-tmp-XXXXXXXX", with exclusive creation and without
//    following links (O_CREAT | O_EXCL | O_NOFOLLOW), so a link planted at any
//    name cannot redirect a write;
//  - a file is renamed over its target only when completely written and
//    flushed; on failure the temporary file is removed.
#include <filesystem>
#include <functional>
#include <iosfwd>
#include <string_view>
#include <string>
#include <vector>

namespace gapmark {

/// The marker in the names of gapmark's temporary files.
inline constexpr const char* kTempMarker = ".gapmark-tmp-";

/// Refuses (InputError naming `path`) an output file that exists and is not
/// a regular file (folder, device, FIFO, socket) or is a symbolic link; and,
/// unless `force`, one that exists at all ("exists already; give --force").
void check_output_file(const std::filesystem::path& path, bool force);

/// Refuses an output folder that exists and is not a folder (a file, a
/// device ...). A symbolic link to a folder is accepted.
void check_output_folder(const std::filesystem::path& dir);

/// Refuses (InputError) an output folder that holds one of `inputs` (a data
/// file, the spec), at any depth, naming the input.
void check_folder_holds_no_input(const std::filesystem::path& dir, const std::vector<std::filesystem::path>& inputs,
                                 const std::string& hint);

/// Refuses (InputError) an output file that is one of `inputs`.
void check_file_is_no_input(const std::filesystem::path& path, const std::vector<std::filesystem::path>& inputs);

/// A temporary file beside `target`, open for writing. commit() flushes it
/// to disk and renames it over the target (refusing a target that is not a
/// regular file); if commit() is never reached, the file is removed.
class TempFile {
public:
  explicit TempFile(const std::filesystem::path& target);
  ~TempFile();
  TempFile(const TempFile&) = delete;
  TempFile& operator=(const TempFile&) = delete;

  int fd() const { return fd_; }
  const std::filesystem::path& path() const { return path_; }
  const std::filesystem::path& target() const { return target_; }
  /// Writes all of `text` (InputError naming the target on failure).
  void write(std::string_view text);
  /// Lets `fill` write through a buffered stream into the file.
  void write_with(const std::function<void(std::ostream&)>& fill);
  /// Flushes and closes the file; it keeps its temporary name.
  void close();
  /// close(), then renames it over the target.
  void commit();
  /// Gives up ownership: the file stays under its temporary name (it is the
  /// caller's to rename or remove).
  std::filesystem::path release();

private:
  std::filesystem::path target_, path_;
  int fd_ = -1;
  bool owned_ = true;
};

/// Checks that `target` may be replaced (absent, or a regular file that is
/// not a symbolic link), then renames `temp` over it. InputError naming the
/// target otherwise; `temp` is left for the caller to remove.
void rename_over(const std::filesystem::path& temp, const std::filesystem::path& target);

/// Removes the temporary files gapmark left in `dir` (names holding
/// kTempMarker) — only call this while holding the folder's run lock. Returns
/// how many were removed.
std::size_t remove_stale_temp_files(const std::filesystem::path& dir);

/// An advisory lock (flock) on DIR/.gapmark-lock held for the object's
/// lifetime: one run, resume or merge per output folder at a time. The file
/// holds the holder's process id; a second process is refused with an
/// InputError naming the folder and that process.
class FolderLock {
public:
  explicit FolderLock(const std::filesystem::path& dir);
  ~FolderLock();
  FolderLock(const FolderLock&) = delete;
  FolderLock& operator=(const FolderLock&) = delete;

private:
  int fd_ = -1;
};

inline constexpr const char* kLockFile = ".gapmark-lock";

}  // namespace gapmark
