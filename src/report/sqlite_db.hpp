#pragma once
// A GeoPackage opened straight through SQLite once GDAL has closed it: the result rows of the
// two large layers and the packed spatial indexes are written this way (gpkg_rows.hpp,
// gpkg_rtree.hpp). Every failure throws rimline::Error naming the file and the table.
#include <sqlite3.h>

#include <memory>
#include <string>

#include "report/write_failure.hpp"
#include "rimline/error.hpp"

namespace rimline::report {

struct SqliteStmtCloser {
  void operator()(sqlite3_stmt* s) const { sqlite3_finalize(s); }
};
using SqliteStmt = std::unique_ptr<sqlite3_stmt, SqliteStmtCloser>;

class SqliteDb {
 public:
  // One thread uses the connection at a time, so the connection's own mutex is left out
  // (SQLITE_OPEN_NOMUTEX; SQLite's process-wide allocator lock stays).
  explicit SqliteDb(const std::string& path) : path_(path) {
    sqlite3* db = nullptr;
    const int rc = sqlite3_open_v2(path.c_str(), &db, SQLITE_OPEN_READWRITE | SQLITE_OPEN_NOMUTEX, nullptr);
    db_.reset(db);
    if (rc != SQLITE_OK) fail("", "cannot be opened to write its result rows and spatial indexes");
  }
  void exec(const std::string& sql, const std::string& table) {
    char* msg = nullptr;
    if (sqlite3_exec(db_.get(), sql.c_str(), nullptr, nullptr, &msg) != SQLITE_OK) {
      const std::string m = msg ? msg : "unknown SQLite error";
      sqlite3_free(msg);
      fail(table, "cannot be written: " + m);
    }
  }
  SqliteStmt prepare(const std::string& sql, const std::string& table) {
    sqlite3_stmt* s = nullptr;
    if (sqlite3_prepare_v2(db_.get(), sql.c_str(), -1, &s, nullptr) != SQLITE_OK) fail(table, sqlite3_errmsg(db_.get()));
    return SqliteStmt(s);
  }
  void step_reset(sqlite3_stmt* s, const std::string& table) {
    if (sqlite3_step(s) != SQLITE_DONE) fail(table, std::string("cannot be written: ") + sqlite3_errmsg(db_.get()));
    sqlite3_reset(s);
  }
  [[noreturn]] void fail(const std::string& table, const std::string& what) const {
    // SQLITE_FULL ("database or disk is full") is named as a full disk (write_failure.hpp).
    throw Error(ErrorKind::bad_config, ErrorContext{path_, table, "", ""},
                means_disk_full(0, what) ? write_failure_text(ENOSPC, "") : what);
  }
  sqlite3* get() const { return db_.get(); }

 private:
  struct Closer {
    void operator()(sqlite3* db) const { sqlite3_close(db); }
  };
  std::string path_;
  std::unique_ptr<sqlite3, Closer> db_;
};

inline std::string sql_quoted(const std::string& name) {  // an SQL identifier in double quotes
  std::string q = "\"";
  for (char c : name) q += c == '"' ? std::string("\"\"") : std::string(1, c);
  return q + "\"";
}

inline std::string sql_literal(const std::string& text) {  // an SQL string literal
  std::string q = "'";
  for (char c : text) q += c == '\'' ? std::string("''") : std::string(1, c);
  return q + "'";
}

}  // namespace rimline::report
