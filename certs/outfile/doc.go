// Package outfile writes the files gapcert produces for its user
// (certificates, summaries, tables, pictures) and checks, before any
// computation, that they can be written.
//
// Guarantees:
//
//   - Write, WriteWith and WriteNew replace a file atomically: the bytes go
//     to a temporary file in the target's directory, which is flushed to
//     disk (fsync) and then renamed over the target. A reader of the path
//     sees the earlier file or the complete new one, never a partial file;
//     if writing fails at any point, an earlier file at the path is left
//     as it was and the temporary file is removed. A path that is a
//     symbolic link is written through the link (the link stays).
//   - CheckFile and CheckDir tell, without creating or changing anything
//     at the output path, whether an output file or directory can be
//     written there, and refuse an output that is one of the inputs. They
//     probe the target directory by creating and removing a temporary
//     file, so that permissions, read-only file systems and full quotas
//     are found the same way the write would find them.
//
// Errors meant for the user are *Error values, which name the path and
// give a hint.
package outfile
