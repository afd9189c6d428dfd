/*
 * An in-page stand-in for the Excel host, for the pane's end-to-end test (pane.test.ts).
 * The test serves this file in place of office.js, so dist/taskpane.html runs unchanged.
 *
 * It defines the globals the built pane and worksheet functions use — Office, Excel,
 * OfficeExtension, CustomFunctions — over one in-memory workbook, and a control surface on
 * window.__host for the test: open a workbook, select cells, type into cells as a user would
 * (firing the change events Excel fires), and read back sheets, cells, names, charts and
 * settings, with a count of the calls made.
 *
 * Semantics kept from Excel, because the pane depends on them:
 *   - Excel.run(batch) gives a fresh RequestContext; Excel.run(context, batch) reuses one
 *     (the watch removes its handlers through the context they were added with). The batch
 *     must return a promise. Commands take effect at once and properties are live, so load()
 *     only records what was asked; an error a command causes (an item that does not exist,
 *     an array of the wrong size, a value Excel has no name for) is raised by the next
 *     sync(), as in Office.js, as an Error with Excel's `code`.
 *   - getItem of a missing item fails the batch with ItemNotFound; *OrNullObject gives an
 *     object whose isNullObject is true.
 *   - Addresses as Excel writes them: "Rates!A1:E726", "'Fairlead Outlook'!B20", whole
 *     columns "Rates!A:A", whole rows "Rates!1:3"; sheet names that are not a plain word are
 *     quoted, with quotes doubled.
 *   - Range.values: "" for an empty cell; a null in a written array leaves that cell alone; a
 *     text that reads as a number or as a yyyy-mm-dd date is stored as a number (a date
 *     serial) unless the cell is formatted as text ("@"), as Excel parses typed entries.
 *   - getUsedRange(valuesOnly): the smallest rectangle holding every non-empty value (and,
 *     without valuesOnly, every formatted cell).
 *   - A row typed directly under a table joins the table (Excel's table auto-expansion);
 *     writes through the API do not expand tables.
 *   - After cells change, Worksheet.onChanged fires on their sheet and Table.onChanged on each
 *     table they touch ({type, changeType, source, address (without the sheet), worksheetId,
 *     tableId}), then onCalculated. Events are delivered after the change, asynchronously.
 *   - Charts keep their series as ranges: the test reads what each series shows.
 *   - Requirement sets: ExcelApi up to 1.12 is supported, 1.13 and later are not.
 *
 * Plain browser JavaScript, loaded by a <script> tag: no build step, no imports.
 */
(function () {
  "use strict";

  var MAX_ROWS = 1048576;
  var MAX_COLS = 16384;
  /** Excel refuses to return ranges this large in one response. */
  var MAX_CELLS_READ = 5000000;
  var SUPPORTED_EXCEL_API = "1.12";

  // ---- errors -------------------------------------------------------------------------

  function OfficeError(code, message, location) {
    var e = new Error(message);
    e.name = "RichApi.Error";
    e.code = code;
    e.debugInfo = { code: code, message: message, errorLocation: location || "" };
    return e;
  }

  var ErrorCodes = {
    itemNotFound: "ItemNotFound",
    invalidArgument: "InvalidArgument",
    itemAlreadyExists: "ItemAlreadyExists",
    invalidOperation: "InvalidOperation",
    invalidReference: "InvalidReference",
    responsePayloadSizeLimitExceeded: "ResponsePayloadSizeLimitExceeded",
  };

  // ---- the call count -----------------------------------------------------------------

  var calls = {};
  function count(what) {
    calls[what] = (calls[what] || 0) + 1;
  }

  // ---- A1 addresses -------------------------------------------------------------------

  function colLetters(index) {
    var s = "";
    for (var n = index + 1; n > 0; n = Math.floor((n - 1) / 26)) s = String.fromCharCode(65 + ((n - 1) % 26)) + s;
    return s;
  }

  function colIndex(letters) {
    var n = 0;
    var up = letters.toUpperCase();
    for (var i = 0; i < up.length; i++) n = n * 26 + (up.charCodeAt(i) - 64);
    return n - 1;
  }

  /** Quoted unless a plain word that cannot be read as a cell or an R1C1 reference. */
  function quoteSheet(name) {
    var plain = /^[A-Za-z_][A-Za-z0-9_.]*$/.test(name) && !/^[A-Za-z]{1,3}\d+$/.test(name) && !/^R\d*C\d*$/i.test(name);
    return plain ? name : "'" + name.replace(/'/g, "''") + "'";
  }

  function cellA1(row, col, absolute) {
    var d = absolute ? "$" : "";
    return d + colLetters(col) + d + (row + 1);
  }

  /** A rectangle {top, left, bottom, right} (0-based, inclusive) as Excel writes it. */
  function rectA1(r, absolute) {
    var d = absolute ? "$" : "";
    var wholeCols = r.top === 0 && r.bottom === MAX_ROWS - 1;
    var wholeRows = r.left === 0 && r.right === MAX_COLS - 1;
    if (wholeCols && !wholeRows) return d + colLetters(r.left) + ":" + d + colLetters(r.right);
    if (wholeRows) return d + (r.top + 1) + ":" + d + (r.bottom + 1);
    var start = cellA1(r.top, r.left, absolute);
    return r.top === r.bottom && r.left === r.right ? start : start + ":" + cellA1(r.bottom, r.right, absolute);
  }

  function parseRef(text) {
    var m = /^\$?([A-Za-z]{1,3})?\$?(\d{1,7})?$/.exec(text);
    if (!m || (m[1] === undefined && m[2] === undefined)) return null;
    var col = m[1] === undefined ? null : colIndex(m[1]);
    var row = m[2] === undefined ? null : Number(m[2]) - 1;
    if (col !== null && (col < 0 || col >= MAX_COLS)) return null;
    if (row !== null && (row < 0 || row >= MAX_ROWS)) return null;
    return { row: row, col: col };
  }

  /** "B2", "A1:E726", "A:A", "B:N", "3:5" (no sheet part) → rectangle, or null. */
  function parseLocal(text) {
    var ends = text.trim().split(":");
    if (ends.length > 2) return null;
    var a = parseRef(ends[0]);
    var b = ends.length === 2 ? parseRef(ends[1]) : a;
    if (!a || !b) return null;
    var kind = function (x) {
      return x.row !== null && x.col !== null ? "cell" : x.col !== null ? "col" : "row";
    };
    if (kind(a) !== kind(b)) return null;
    if (kind(a) === "cell") {
      return { top: Math.min(a.row, b.row), left: Math.min(a.col, b.col), bottom: Math.max(a.row, b.row), right: Math.max(a.col, b.col) };
    }
    if (kind(a) === "col") {
      if (ends.length !== 2) return null; // "A" alone is not an address
      return { top: 0, left: Math.min(a.col, b.col), bottom: MAX_ROWS - 1, right: Math.max(a.col, b.col) };
    }
    if (ends.length !== 2) return null;
    return { top: Math.min(a.row, b.row), left: 0, bottom: Math.max(a.row, b.row), right: MAX_COLS - 1 };
  }

  /** "'Fairlead Outlook'!$B$20:$B$31" or "=Rates!A1" → {sheet, rect}; sheet null when absent. */
  function parseAddress(text) {
    var t = String(text).trim().replace(/^=/, "");
    var sheet = null;
    var local = t;
    if (t.charAt(0) === "'") {
      var name = "";
      var i = 1;
      for (; i < t.length; i++) {
        if (t.charAt(i) === "'") {
          if (t.charAt(i + 1) === "'") {
            name += "'";
            i++;
            continue;
          }
          break;
        }
        name += t.charAt(i);
      }
      if (t.charAt(i + 1) !== "!") return null;
      sheet = name;
      local = t.slice(i + 2);
    } else {
      var bang = t.lastIndexOf("!");
      if (bang >= 0) {
        sheet = t.slice(0, bang);
        local = t.slice(bang + 1);
      }
    }
    var rect = parseLocal(local);
    return rect ? { sheet: sheet, rect: rect } : null;
  }

  function intersect(a, b) {
    var r = { top: Math.max(a.top, b.top), left: Math.max(a.left, b.left), bottom: Math.min(a.bottom, b.bottom), right: Math.min(a.right, b.right) };
    return r.top <= r.bottom && r.left <= r.right ? r : null;
  }

  function rows(r) {
    return r.bottom - r.top + 1;
  }
  function cols(r) {
    return r.right - r.left + 1;
  }

  // ---- values as Excel holds them -------------------------------------------------------

  var EXCEL_EPOCH_MS = Date.UTC(1899, 11, 30);

  function isoDateSerial(text) {
    var m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text);
    if (!m) return null;
    var ms = Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]));
    var d = new Date(ms);
    if (d.getUTCMonth() !== Number(m[2]) - 1 || d.getUTCDate() !== Number(m[3])) return null;
    return Math.round((ms - EXCEL_EPOCH_MS) / 86400000);
  }

  /**
   * What a cell holds after `value` is entered into a cell of number format `format`:
   * {v, f}, f undefined when the format is left alone. Text that Excel would parse (a plain
   * number, a yyyy-mm-dd date) becomes a number unless the cell is formatted as text.
   */
  function entered(value, format) {
    if (typeof value === "number") {
      if (!isFinite(value)) return { error: "Range.values: " + value + " is not a number Excel can hold." };
      return { v: value };
    }
    if (typeof value === "boolean") return { v: value };
    if (typeof value !== "string") return { error: "Range.values: a " + typeof value + " is not a cell value." };
    if (value === "" || format === "@") return { v: value };
    if (/^\s*[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?\s*$/.test(value)) return { v: Number(value) };
    var serial = isoDateSerial(value.trim());
    if (serial !== null) return { v: serial, f: isGeneral(format) ? "yyyy-mm-dd" : undefined };
    return { v: value };
  }

  function isGeneral(f) {
    return f === undefined || f === null || f === "" || f === "General";
  }

  // ---- the workbook model ---------------------------------------------------------------

  var book = null;
  var opened = null;
  var openedResolve = null;
  var pendingEvents = [];
  var customFunctions = {};
  var errorsSeen = [];

  function newBook() {
    return {
      name: "",
      sheets: [],
      tables: [],
      names: [],
      settings: {},
      activeSheetId: null,
      selection: null,
      calculated: [],
      nextId: 1,
      charts: 0,
    };
  }

  function newId(prefix) {
    var n = book.nextId++;
    return prefix === "sheet" ? "{" + ("00000000" + n.toString(16)).slice(-8).toUpperCase() + "-0001-0000-0000-000000000000}" : prefix + n;
  }

  function sameName(a, b) {
    return String(a).toUpperCase() === String(b).toUpperCase();
  }

  function newSheet(name) {
    return { id: newId("sheet"), name: name, cells: new Map(), tabColor: "", widths: {}, charts: [], changed: [], calculated: [], frozen: null };
  }

  function sheetByKey(key) {
    for (var i = 0; i < book.sheets.length; i++) {
      var s = book.sheets[i];
      if (s.id === key || sameName(s.name, key)) return s;
    }
    return null;
  }

  function sheetById(id) {
    for (var i = 0; i < book.sheets.length; i++) if (book.sheets[i].id === id) return book.sheets[i];
    return null;
  }

  function key(row, col) {
    return row * MAX_COLS + col;
  }

  function cellAt(sheet, row, col) {
    return sheet.cells.get(key(row, col));
  }

  function valueAt(sheet, row, col) {
    var c = cellAt(sheet, row, col);
    return c && c.v !== undefined ? c.v : "";
  }

  function formatAt(sheet, row, col) {
    var c = cellAt(sheet, row, col);
    return c && c.f !== undefined ? c.f : "General";
  }

  function touchCell(sheet, row, col) {
    var k = key(row, col);
    var c = sheet.cells.get(k);
    if (!c) {
      c = {};
      sheet.cells.set(k, c);
    }
    return c;
  }

  function tidy(sheet, row, col) {
    var k = key(row, col);
    var c = sheet.cells.get(k);
    if (c && (c.v === undefined || c.v === "") && isGeneral(c.f) && !c.look) sheet.cells.delete(k);
  }

  function setValue(sheet, row, col, v, f) {
    var c = touchCell(sheet, row, col);
    if (v === "") delete c.v;
    else c.v = v;
    if (f !== undefined) c.f = f;
    tidy(sheet, row, col);
  }

  function setFormat(sheet, row, col, f) {
    var c = touchCell(sheet, row, col);
    if (isGeneral(f)) delete c.f;
    else c.f = f;
    tidy(sheet, row, col);
  }

  function setLook(sheet, row, col, part, field, value) {
    var c = touchCell(sheet, row, col);
    c.look = c.look || {};
    c.look[part] = c.look[part] || {};
    c.look[part][field] = value;
  }

  /** Calls f(row, col, cell) for every stored cell inside rect. */
  function eachCellIn(sheet, rect, f) {
    var area = rows(rect) * cols(rect);
    if (area <= sheet.cells.size) {
      for (var r = rect.top; r <= rect.bottom; r++) {
        for (var c = rect.left; c <= rect.right; c++) {
          var cell = cellAt(sheet, r, c);
          if (cell) f(r, c, cell);
        }
      }
      return;
    }
    sheet.cells.forEach(function (cell, k) {
      var row = Math.floor(k / MAX_COLS);
      var col = k % MAX_COLS;
      if (row >= rect.top && row <= rect.bottom && col >= rect.left && col <= rect.right) f(row, col, cell);
    });
  }

  /** The smallest rectangle in `within` holding values (and formats too, unless valuesOnly); null when none. */
  function usedRect(sheet, within, valuesOnly) {
    var out = null;
    eachCellIn(sheet, within, function (r, c, cell) {
      var filled = cell.v !== undefined && cell.v !== "";
      if (!filled && (valuesOnly || (isGeneral(cell.f) && !cell.look))) return;
      if (!out) out = { top: r, left: c, bottom: r, right: c };
      else {
        out.top = Math.min(out.top, r);
        out.left = Math.min(out.left, c);
        out.bottom = Math.max(out.bottom, r);
        out.right = Math.max(out.right, c);
      }
    });
    return out;
  }

  var WHOLE_SHEET = { top: 0, left: 0, bottom: MAX_ROWS - 1, right: MAX_COLS - 1 };

  function grid(sheet, rect, read) {
    if (rows(rect) * cols(rect) > MAX_CELLS_READ) {
      throw OfficeError(ErrorCodes.responsePayloadSizeLimitExceeded, "The response payload size has exceeded the limit.");
    }
    var out = [];
    for (var r = rect.top; r <= rect.bottom; r++) {
      var row = [];
      for (var c = rect.left; c <= rect.right; c++) row.push(read(sheet, r, c));
      out.push(row);
    }
    return out;
  }

  // ---- tables -----------------------------------------------------------------------------

  function tableByKey(key) {
    for (var i = 0; i < book.tables.length; i++) {
      var t = book.tables[i];
      if (t.id === key || sameName(t.name, key)) return t;
    }
    return null;
  }

  function tableRect(t) {
    return { top: t.top, left: t.left, bottom: t.bottom, right: t.right };
  }

  function tableColumnNames(t) {
    var sheet = sheetById(t.sheetId);
    var names = [];
    for (var c = t.left; c <= t.right; c++) {
      var v = t.showHeaders ? valueAt(sheet, t.top, c) : t.hiddenHeaders[c - t.left];
      names.push(v === "" ? "Column" + (c - t.left + 1) : String(v));
    }
    return names;
  }

  function bodyRect(t) {
    var top = t.top + (t.showHeaders ? 1 : 0);
    var bottom = t.bottom - (t.showTotals ? 1 : 0);
    return { top: top, left: t.left, bottom: Math.max(top, bottom), right: t.right };
  }

  // ---- change events ------------------------------------------------------------------------

  /** Queues the events Excel fires after `rect` of `sheet` changed; `bySelf` for the add-in's own writes. */
  function changed(sheet, rect, bySelf) {
    pendingEvents.push({ sheet: sheet, rect: rect, bySelf: bySelf });
  }

  function deliver(handlers, args) {
    handlers.slice().forEach(function (h) {
      try {
        var p = h.handler(args);
        if (p && typeof p.catch === "function") {
          p.catch(function (e) {
            errorsSeen.push(String(e && e.message ? e.message : e));
          });
        }
      } catch (e) {
        errorsSeen.push(String(e && e.message ? e.message : e));
      }
    });
  }

  function flushEvents() {
    if (pendingEvents.length === 0) return;
    var batch = pendingEvents;
    pendingEvents = [];
    setTimeout(function () {
      var calcSheets = [];
      batch.forEach(function (e) {
        var address = rectA1(e.rect);
        var common = { source: "Local", changeType: "RangeEdited", worksheetId: e.sheet.id, triggerSource: e.bySelf ? "ThisLocalAddin" : "Others" };
        deliver(e.sheet.changed, Object.assign({ type: "WorksheetChanged", address: address }, common));
        count("event.WorksheetChanged");
        book.tables.forEach(function (t) {
          if (t.sheetId !== e.sheet.id) return;
          var part = intersect(tableRect(t), e.rect);
          if (!part) return;
          deliver(t.changed, Object.assign({ type: "TableChanged", address: rectA1(part), tableId: t.id }, common));
          count("event.TableChanged");
        });
        if (calcSheets.indexOf(e.sheet) < 0) calcSheets.push(e.sheet);
      });
      // Excel recalculates after cells change: onCalculated follows the change events.
      calcSheets.forEach(function (s) {
        var args = { type: "WorksheetCalculated", worksheetId: s.id, address: "" };
        deliver(s.calculated, args);
        deliver(book.calculated, args);
        count("event.WorksheetCalculated");
      });
    }, 0);
  }

  // ---- request contexts -------------------------------------------------------------------

  function RequestContext() {
    this._error = null;
    this._loads = 0;
    this.workbook = workbookProxy(this);
    this.trackedObjects = { add: function () {}, remove: function () {} };
  }

  RequestContext.prototype._fail = function (code, message) {
    if (!this._error) this._error = OfficeError(code, message);
  };

  RequestContext.prototype.sync = function () {
    count("sync");
    var ctx = this;
    return new Promise(function (resolve, reject) {
      // A round trip to the host: the page gets a turn before the answer comes back.
      setTimeout(function () {
        flushEvents();
        var e = ctx._error;
        ctx._error = null;
        if (e) reject(e);
        else resolve(undefined);
      }, 0);
    });
  };

  /** An object that stands for an item that was not found: anything asked of it is absorbed. */
  function broken() {
    var target = function () {};
    var p = new Proxy(target, {
      get: function (_t, prop) {
        if (prop === "then" || typeof prop === "symbol") return undefined;
        if (prop === "isNullObject") return false;
        return p;
      },
      set: function () {
        return true;
      },
      apply: function () {
        return p;
      },
    });
    return p;
  }

  /** The *OrNullObject answer for a missing item. */
  function nullObject(ctx, what) {
    return new Proxy(
      {},
      {
        get: function (_t, prop) {
          if (prop === "isNullObject") return true;
          if (prop === "load") return function () { return this; };
          if (prop === "toJSON") return function () { return {}; };
          return undefined;
        },
        set: function (_t, prop) {
          ctx._fail(ErrorCodes.itemNotFound, "Cannot set " + String(prop) + " of " + what + ": it does not exist.");
          return true;
        },
      },
    );
  }

  function missing(ctx, what) {
    ctx._fail(ErrorCodes.itemNotFound, "The requested resource doesn't exist. (" + what + ")");
    return broken();
  }

  function loader(obj) {
    obj.load = function () {
      count("load");
      return obj;
    };
    obj.isNullObject = false;
    return obj;
  }

  function eventSource(ctx, list, name) {
    return {
      add: function (handler) {
        count(name + ".add");
        var entry = { handler: handler };
        list.push(entry);
        return {
          context: ctx,
          remove: function () {
            count(name + ".remove");
            var i = list.indexOf(entry);
            if (i >= 0) list.splice(i, 1);
          },
        };
      },
    };
  }

  function checkEnum(ctx, what, value, allowed) {
    if (allowed.indexOf(value) < 0) {
      ctx._fail(ErrorCodes.invalidArgument, "The argument is invalid or missing or has an incorrect format. (" + what + " = " + JSON.stringify(value) + ")");
      return false;
    }
    return true;
  }

  // ---- workbook -----------------------------------------------------------------------------

  function workbookProxy(ctx) {
    var wb = loader({});
    Object.defineProperty(wb, "name", { get: function () { return book.name; } });
    wb.worksheets = worksheetCollection(ctx);
    wb.tables = tableCollection(ctx, null);
    wb.names = namedItemCollection(ctx);
    wb.settings = settingCollection(ctx);
    wb.getSelectedRange = function () {
      count("getSelectedRange");
      var sel = book.selection;
      var sheet = sel ? sheetById(sel.sheetId) : null;
      if (!sheet) return missing(ctx, "selection");
      return rangeProxy(ctx, sheet, sel.rect);
    };
    wb.getActiveWorksheet = function () {
      return worksheetProxy(ctx, sheetById(book.activeSheetId));
    };
    return wb;
  }

  function worksheetCollection(ctx) {
    var col = loader({});
    Object.defineProperty(col, "items", {
      get: function () {
        return book.sheets.map(function (s) { return worksheetProxy(ctx, s); });
      },
    });
    Object.defineProperty(col, "count", { get: function () { return book.sheets.length; } });
    col.getCount = function () { return { value: book.sheets.length }; };
    col.getItem = function (k) {
      count("worksheets.getItem");
      var s = sheetByKey(k);
      return s ? worksheetProxy(ctx, s) : missing(ctx, "worksheet " + k);
    };
    col.getItemOrNullObject = function (k) {
      count("worksheets.getItemOrNullObject");
      var s = sheetByKey(k);
      return s ? worksheetProxy(ctx, s) : nullObject(ctx, "worksheet " + k);
    };
    col.getActiveWorksheet = function () {
      return worksheetProxy(ctx, sheetById(book.activeSheetId));
    };
    col.add = function (name) {
      count("worksheets.add");
      var n = name === undefined ? "Sheet" + (book.sheets.length + 1) : String(name);
      if (sheetByKey(n) || n.length > 31 || /[:\\/?*[\]]/.test(n) || n.trim() === "") {
        ctx._fail(sheetByKey(n) ? ErrorCodes.itemAlreadyExists : ErrorCodes.invalidArgument, "A sheet cannot be named " + JSON.stringify(n) + ".");
        return broken();
      }
      var s = newSheet(n);
      book.sheets.push(s);
      return worksheetProxy(ctx, s);
    };
    col.onCalculated = eventSource(ctx, book.calculated, "worksheets.onCalculated");
    col.onChanged = eventSource(ctx, [], "worksheets.onChanged");
    return col;
  }

  function worksheetProxy(ctx, sheet) {
    var ws = loader({});
    Object.defineProperty(ws, "name", {
      get: function () { return sheet.name; },
      set: function (v) {
        if (sheetByKey(v) && sheetByKey(v) !== sheet) ctx._fail(ErrorCodes.itemAlreadyExists, "A sheet is already named " + v + ".");
        else sheet.name = String(v);
      },
    });
    Object.defineProperty(ws, "id", { get: function () { return sheet.id; } });
    Object.defineProperty(ws, "position", { get: function () { return book.sheets.indexOf(sheet); } });
    Object.defineProperty(ws, "tabColor", {
      get: function () { return sheet.tabColor; },
      set: function (v) { sheet.tabColor = String(v); },
    });
    Object.defineProperty(ws, "visibility", { get: function () { return "Visible"; } });
    ws.activate = function () {
      count("worksheet.activate");
      book.activeSheetId = sheet.id;
    };
    ws.getRange = function (address) {
      count("worksheet.getRange");
      if (address === undefined || address === "") return rangeProxy(ctx, sheet, WHOLE_SHEET);
      var p = parseAddress(address);
      if (!p || (p.sheet !== null && !sameName(p.sheet, sheet.name))) {
        ctx._fail(ErrorCodes.invalidArgument, "The argument is invalid or missing or has an incorrect format. (address " + address + ")");
        return broken();
      }
      return rangeProxy(ctx, sheet, p.rect);
    };
    ws.getRangeByIndexes = function (row, col, rowCount, colCount) {
      count("worksheet.getRangeByIndexes");
      if (!(row >= 0 && col >= 0 && rowCount >= 1 && colCount >= 1 && row + rowCount <= MAX_ROWS && col + colCount <= MAX_COLS) || [row, col, rowCount, colCount].some(function (x) { return !Number.isInteger(x); })) {
        ctx._fail(ErrorCodes.invalidArgument, "getRangeByIndexes(" + [row, col, rowCount, colCount].join(", ") + ") is not a range on the sheet.");
        return broken();
      }
      return rangeProxy(ctx, sheet, { top: row, left: col, bottom: row + rowCount - 1, right: col + colCount - 1 });
    };
    ws.getCell = function (row, col) {
      return ws.getRangeByIndexes(row, col, 1, 1);
    };
    ws.getUsedRange = function (valuesOnly) {
      var r = usedRect(sheet, WHOLE_SHEET, Boolean(valuesOnly));
      // Excel answers A1 for an empty sheet.
      return rangeProxy(ctx, sheet, r || { top: 0, left: 0, bottom: 0, right: 0 });
    };
    ws.getUsedRangeOrNullObject = function (valuesOnly) {
      count("worksheet.getUsedRangeOrNullObject");
      var r = usedRect(sheet, WHOLE_SHEET, Boolean(valuesOnly));
      return r ? rangeProxy(ctx, sheet, r) : nullObject(ctx, "used range of " + sheet.name);
    };
    ws.charts = chartCollection(ctx, sheet);
    ws.tables = tableCollection(ctx, sheet);
    ws.onChanged = eventSource(ctx, sheet.changed, "worksheet.onChanged");
    ws.onCalculated = eventSource(ctx, sheet.calculated, "worksheet.onCalculated");
    ws.delete = function () {
      count("worksheet.delete");
      var i = book.sheets.indexOf(sheet);
      if (i >= 0) book.sheets.splice(i, 1);
      book.tables = book.tables.filter(function (t) { return t.sheetId !== sheet.id; });
    };
    return ws;
  }

  // ---- ranges -------------------------------------------------------------------------------

  var BORDER_EDGES = ["EdgeTop", "EdgeBottom", "EdgeLeft", "EdgeRight", "InsideVertical", "InsideHorizontal", "DiagonalDown", "DiagonalUp"];
  var BORDER_STYLES = ["None", "Continuous", "Dash", "DashDot", "DashDotDot", "Dot", "Double", "SlantDashDot"];

  /** Checks that `value` is a rows × cols array (or one value for every cell); the array, or null after failing ctx. */
  function shaped(ctx, what, value, rect) {
    if (!Array.isArray(value)) {
      return grid(null, rect, function () { return value; });
    }
    var ok = value.length === rows(rect) && value.every(function (r) { return Array.isArray(r) && r.length === cols(rect); });
    if (!ok) {
      ctx._fail(
        ErrorCodes.invalidArgument,
        "The number of rows or columns in the input array doesn't match the size or dimensions of the range. (" + what + " " + value.length + "×" + (Array.isArray(value[0]) ? value[0].length : "?") + " for " + rows(rect) + "×" + cols(rect) + ")",
      );
      return null;
    }
    return value;
  }

  function writeValues(ctx, sheet, rect, value, bySelf) {
    var v = shaped(ctx, "values", value, rect);
    if (!v) return false;
    for (var r = 0; r < v.length; r++) {
      for (var c = 0; c < v[r].length; c++) {
        if (v[r][c] === null || v[r][c] === undefined) continue; // null leaves the cell as it is
        var e = entered(v[r][c], formatAt(sheet, rect.top + r, rect.left + c));
        if (e.error) {
          ctx._fail(ErrorCodes.invalidArgument, e.error + " (cell " + cellA1(rect.top + r, rect.left + c) + ")");
          return false;
        }
        setValue(sheet, rect.top + r, rect.left + c, e.v, e.f);
      }
    }
    changed(sheet, rect, bySelf);
    return true;
  }

  function rangeProxy(ctx, sheet, rect) {
    var rg = loader({});
    rg._sheet = sheet;
    rg._rect = rect;
    Object.defineProperty(rg, "address", { get: function () { return quoteSheet(sheet.name) + "!" + rectA1(rect); } });
    Object.defineProperty(rg, "addressLocal", { get: function () { return quoteSheet(sheet.name) + "!" + rectA1(rect); } });
    Object.defineProperty(rg, "rowIndex", { get: function () { return rect.top; } });
    Object.defineProperty(rg, "columnIndex", { get: function () { return rect.left; } });
    Object.defineProperty(rg, "rowCount", { get: function () { return rows(rect); } });
    Object.defineProperty(rg, "columnCount", { get: function () { return cols(rect); } });
    Object.defineProperty(rg, "cellCount", { get: function () { return rows(rect) * cols(rect); } });
    Object.defineProperty(rg, "values", {
      get: function () { return grid(sheet, rect, valueAt); },
      set: function (value) {
        count("range.values=");
        writeValues(ctx, sheet, rect, value, true);
      },
    });
    Object.defineProperty(rg, "formulas", {
      get: function () { return grid(sheet, rect, valueAt); },
      set: function (value) {
        count("range.formulas=");
        writeValues(ctx, sheet, rect, value, true);
      },
    });
    Object.defineProperty(rg, "text", {
      get: function () { return grid(sheet, rect, function (s, r, c) { return String(valueAt(s, r, c)); }); },
    });
    Object.defineProperty(rg, "valueTypes", {
      get: function () {
        return grid(sheet, rect, function (s, r, c) {
          var v = valueAt(s, r, c);
          return v === "" ? "Empty" : typeof v === "number" ? "Double" : typeof v === "boolean" ? "Boolean" : "String";
        });
      },
    });
    Object.defineProperty(rg, "numberFormat", {
      get: function () { return grid(sheet, rect, formatAt); },
      set: function (value) {
        count("range.numberFormat=");
        var f = shaped(ctx, "numberFormat", value, rect);
        if (!f) return;
        for (var r = 0; r < f.length; r++) {
          for (var c = 0; c < f[r].length; c++) {
            if (f[r][c] === null || f[r][c] === undefined) continue;
            if (typeof f[r][c] !== "string") {
              ctx._fail(ErrorCodes.invalidArgument, "Range.numberFormat: " + JSON.stringify(f[r][c]) + " is not a format.");
              return;
            }
            setFormat(sheet, rect.top + r, rect.left + c, f[r][c]);
          }
        }
      },
    });
    Object.defineProperty(rg, "worksheet", { get: function () { return worksheetProxy(ctx, sheet); } });

    function sub(top, left, bottom, right) {
      if (top < 0 || left < 0 || bottom >= MAX_ROWS || right >= MAX_COLS || top > bottom || left > right) {
        ctx._fail(ErrorCodes.invalidArgument, "The range would fall outside the sheet.");
        return broken();
      }
      return rangeProxy(ctx, sheet, { top: top, left: left, bottom: bottom, right: right });
    }
    rg.getCell = function (r, c) {
      return sub(rect.top + r, rect.left + c, rect.top + r, rect.left + c);
    };
    rg.getColumn = function (c) {
      if (c < 0 || c >= cols(rect)) return missing(ctx, "column " + c + " of " + rg.address);
      return sub(rect.top, rect.left + c, rect.bottom, rect.left + c);
    };
    rg.getRow = function (r) {
      if (r < 0 || r >= rows(rect)) return missing(ctx, "row " + r + " of " + rg.address);
      return sub(rect.top + r, rect.left, rect.top + r, rect.right);
    };
    rg.getOffsetRange = function (dr, dc) {
      count("range.getOffsetRange");
      return sub(rect.top + dr, rect.left + dc, rect.bottom + dr, rect.right + dc);
    };
    rg.getResizedRange = function (dr, dc) {
      return sub(rect.top, rect.left, rect.bottom + dr, rect.right + dc);
    };
    rg.getEntireColumn = function () {
      return sub(0, rect.left, MAX_ROWS - 1, rect.right);
    };
    rg.getEntireRow = function () {
      return sub(rect.top, 0, rect.bottom, MAX_COLS - 1);
    };
    rg.getUsedRange = function (valuesOnly) {
      var r = usedRect(sheet, rect, Boolean(valuesOnly));
      if (!r) return missing(ctx, "used range of " + rg.address);
      return rangeProxy(ctx, sheet, r);
    };
    rg.getUsedRangeOrNullObject = function (valuesOnly) {
      count("range.getUsedRangeOrNullObject");
      var r = usedRect(sheet, rect, Boolean(valuesOnly));
      return r ? rangeProxy(ctx, sheet, r) : nullObject(ctx, "used range of " + rg.address);
    };
    // No formulas are modelled, so no cell is part of a spill.
    rg.getSpillParentOrNullObject = function () {
      return nullObject(ctx, "spill parent");
    };
    rg.getSpillingToRangeOrNullObject = function () {
      return nullObject(ctx, "spill range");
    };
    rg.select = function () {
      book.selection = { sheetId: sheet.id, rect: rect };
    };
    rg.clear = function (applyTo) {
      count("range.clear");
      var what = applyTo === undefined ? "All" : applyTo;
      if (!checkEnum(ctx, "Range.clear applyTo", what, ["All", "Formats", "Contents", "Hyperlinks", "RemoveHyperlinks", "ResetContents"])) return;
      var hadValues = false;
      var doomed = [];
      eachCellIn(sheet, rect, function (r, c, cell) {
        if (cell.v !== undefined && cell.v !== "") hadValues = true;
        doomed.push([r, c, cell]);
      });
      doomed.forEach(function (d) {
        var cell = d[2];
        if (what === "All" || what === "Contents") delete cell.v;
        if (what === "All" || what === "Formats") {
          delete cell.f;
          delete cell.look;
        }
        tidy(sheet, d[0], d[1]);
      });
      if (what === "All" || what === "Formats") {
        for (var c = rect.left; c <= rect.right && rows(rect) === MAX_ROWS; c++) delete sheet.widths[c];
      }
      if (hadValues) changed(sheet, rect, true);
    };

    // Formats are accepted and kept per cell (fonts, fills, borders) or per column (widths).
    function looked(part, field, allowed) {
      return {
        get: function () {
          var c = cellAt(sheet, rect.top, rect.left);
          return c && c.look && c.look[part] ? c.look[part][field] : undefined;
        },
        set: function (v) {
          count("format." + part + "." + field);
          if (allowed && !checkEnum(ctx, part + "." + field, v, allowed)) return;
          if (rows(rect) * cols(rect) > 100000) return; // whole rows or columns: not kept cell by cell
          for (var r = rect.top; r <= rect.bottom; r++) for (var c = rect.left; c <= rect.right; c++) setLook(sheet, r, c, part, field, v);
        },
      };
    }
    var font = {};
    ["bold", "italic", "size", "color", "name", "underline"].forEach(function (f) {
      Object.defineProperty(font, f, looked("font", f));
    });
    var fill = {
      clear: function () {
        for (var r = rect.top; r <= rect.bottom && rows(rect) * cols(rect) <= 100000; r++) {
          for (var c = rect.left; c <= rect.right; c++) setLook(sheet, r, c, "fill", "color", undefined);
        }
      },
    };
    Object.defineProperty(fill, "color", looked("fill", "color"));
    var borders = {
      getItem: function (edge) {
        if (!checkEnum(ctx, "border", edge, BORDER_EDGES)) return broken();
        var b = {};
        Object.defineProperty(b, "style", looked("border" + edge, "style", BORDER_STYLES));
        Object.defineProperty(b, "color", looked("border" + edge, "color"));
        Object.defineProperty(b, "weight", looked("border" + edge, "weight", ["Hairline", "Thin", "Medium", "Thick"]));
        return b;
      },
    };
    var format = { font: font, fill: fill, borders: borders };
    Object.defineProperty(format, "columnWidth", {
      get: function () { return sheet.widths[rect.left] !== undefined ? sheet.widths[rect.left] : 48; },
      set: function (v) {
        count("format.columnWidth");
        if (typeof v !== "number" || !(v >= 0)) {
          ctx._fail(ErrorCodes.invalidArgument, "columnWidth " + v + " is not a width.");
          return;
        }
        for (var c = rect.left; c <= rect.right; c++) sheet.widths[c] = v;
      },
    });
    Object.defineProperty(format, "rowHeight", { get: function () { return 15; }, set: function () {} });
    format.autofitColumns = function () {};
    format.autofitRows = function () {};
    Object.defineProperty(format, "horizontalAlignment", { get: function () { return "General"; }, set: function () {} });
    Object.defineProperty(format, "wrapText", { get: function () { return false; }, set: function () {} });
    rg.format = format;
    return rg;
  }

  // ---- tables -------------------------------------------------------------------------------

  function tableCollection(ctx, sheet) {
    var list = function () {
      return book.tables.filter(function (t) { return !sheet || t.sheetId === sheet.id; });
    };
    var col = loader({});
    Object.defineProperty(col, "items", { get: function () { return list().map(function (t) { return tableProxy(ctx, t); }); } });
    Object.defineProperty(col, "count", { get: function () { return list().length; } });
    col.getItem = function (k) {
      count("tables.getItem");
      var t = tableByKey(k);
      return t && list().indexOf(t) >= 0 ? tableProxy(ctx, t) : missing(ctx, "table " + k);
    };
    col.getItemOrNullObject = function (k) {
      count("tables.getItemOrNullObject");
      var t = tableByKey(k);
      return t && list().indexOf(t) >= 0 ? tableProxy(ctx, t) : nullObject(ctx, "table " + k);
    };
    col.getItemAt = function (i) {
      var t = list()[i];
      return t ? tableProxy(ctx, t) : missing(ctx, "table at " + i);
    };
    col.onChanged = eventSource(ctx, [], "tables.onChanged");
    return col;
  }

  function tableProxy(ctx, t) {
    var sheet = sheetById(t.sheetId);
    var tb = loader({});
    Object.defineProperty(tb, "name", {
      get: function () { return t.name; },
      set: function (v) { t.name = String(v); },
    });
    Object.defineProperty(tb, "id", { get: function () { return t.id; } });
    Object.defineProperty(tb, "showHeaders", { get: function () { return t.showHeaders; } });
    Object.defineProperty(tb, "showTotals", { get: function () { return t.showTotals; } });
    Object.defineProperty(tb, "worksheet", { get: function () { return worksheetProxy(ctx, sheet); } });
    tb.getRange = function () {
      return rangeProxy(ctx, sheet, tableRect(t));
    };
    tb.getDataBodyRange = function () {
      return rangeProxy(ctx, sheet, bodyRect(t));
    };
    tb.getHeaderRowRange = function () {
      if (!t.showHeaders) return missing(ctx, "header row of " + t.name);
      return rangeProxy(ctx, sheet, { top: t.top, left: t.left, bottom: t.top, right: t.right });
    };
    tb.getTotalRowRange = function () {
      if (!t.showTotals) return missing(ctx, "totals row of " + t.name);
      return rangeProxy(ctx, sheet, { top: t.bottom, left: t.left, bottom: t.bottom, right: t.right });
    };
    tb.columns = tableColumnCollection(ctx, t, sheet);
    var rowsCol = loader({});
    Object.defineProperty(rowsCol, "count", { get: function () { return rows(bodyRect(t)); } });
    tb.rows = rowsCol;
    tb.onChanged = eventSource(ctx, t.changed, "table.onChanged");
    return tb;
  }

  function tableColumnCollection(ctx, t, sheet) {
    var col = loader({});
    var proxy = function (i) {
      var c = loader({});
      Object.defineProperty(c, "name", { get: function () { return tableColumnNames(t)[i]; } });
      Object.defineProperty(c, "index", { get: function () { return i; } });
      Object.defineProperty(c, "id", { get: function () { return i + 1; } });
      c.getRange = function () {
        return rangeProxy(ctx, sheet, { top: t.top, left: t.left + i, bottom: t.bottom, right: t.left + i });
      };
      c.getDataBodyRange = function () {
        var b = bodyRect(t);
        return rangeProxy(ctx, sheet, { top: b.top, left: t.left + i, bottom: b.bottom, right: t.left + i });
      };
      c.getHeaderRowRange = function () {
        return rangeProxy(ctx, sheet, { top: t.top, left: t.left + i, bottom: t.top, right: t.left + i });
      };
      return c;
    };
    var find = function (k) {
      var names = tableColumnNames(t);
      for (var i = 0; i < names.length; i++) if (sameName(names[i], k) || String(i + 1) === String(k)) return i;
      return -1;
    };
    Object.defineProperty(col, "items", {
      get: function () { return tableColumnNames(t).map(function (_n, i) { return proxy(i); }); },
    });
    Object.defineProperty(col, "count", { get: function () { return cols(tableRect(t)); } });
    col.getItem = function (k) {
      var i = find(k);
      return i >= 0 ? proxy(i) : missing(ctx, "column " + k + " of " + t.name);
    };
    col.getItemOrNullObject = function (k) {
      count("table.columns.getItemOrNullObject");
      var i = find(k);
      return i >= 0 ? proxy(i) : nullObject(ctx, "column " + k + " of " + t.name);
    };
    col.getItemAt = function (i) {
      return i >= 0 && i < cols(tableRect(t)) ? proxy(i) : missing(ctx, "column at " + i);
    };
    return col;
  }

  // ---- names ----------------------------------------------------------------------------------

  function nameByKey(k) {
    for (var i = 0; i < book.names.length; i++) if (sameName(book.names[i].name, k)) return book.names[i];
    return null;
  }

  function namedItemCollection(ctx) {
    var col = loader({});
    Object.defineProperty(col, "items", { get: function () { return book.names.map(function (n) { return namedItemProxy(ctx, n); }); } });
    col.add = function (name, reference, comment) {
      count("names.add");
      var n = String(name);
      if (nameByKey(n)) {
        ctx._fail(ErrorCodes.itemAlreadyExists, "The name " + n + " already exists.");
        return broken();
      }
      // Excel's rule for defined names: a letter, _ or \ first; no spaces; not a cell reference.
      if (!/^[A-Za-z_\\][A-Za-z0-9_.\\]*$/.test(n) || /^[A-Za-z]{1,3}\d+$/.test(n) || /^[RrCc]$/.test(n)) {
        ctx._fail(ErrorCodes.invalidArgument, "The name " + JSON.stringify(n) + " is not valid.");
        return broken();
      }
      var formula = typeof reference === "string" ? reference : reference && reference._sheet ? "=" + quoteSheet(reference._sheet.name) + "!" + rectA1(reference._rect, true) : null;
      if (formula === null) {
        ctx._fail(ErrorCodes.invalidArgument, "names.add needs a reference.");
        return broken();
      }
      var item = { name: n, formula: formula.charAt(0) === "=" ? formula : "=" + formula, comment: comment || "", visible: true };
      book.names.push(item);
      return namedItemProxy(ctx, item);
    };
    col.getItem = function (k) {
      var n = nameByKey(k);
      return n ? namedItemProxy(ctx, n) : missing(ctx, "name " + k);
    };
    col.getItemOrNullObject = function (k) {
      count("names.getItemOrNullObject");
      var n = nameByKey(k);
      return n ? namedItemProxy(ctx, n) : nullObject(ctx, "name " + k);
    };
    return col;
  }

  function namedItemProxy(ctx, item) {
    var ni = loader({});
    Object.defineProperty(ni, "name", { get: function () { return item.name; } });
    Object.defineProperty(ni, "type", { get: function () { return "Range"; } });
    Object.defineProperty(ni, "visible", { get: function () { return item.visible; }, set: function (v) { item.visible = Boolean(v); } });
    Object.defineProperty(ni, "comment", { get: function () { return item.comment; }, set: function (v) { item.comment = String(v); } });
    Object.defineProperty(ni, "formula", {
      get: function () { return item.formula; },
      set: function (v) {
        count("name.formula=");
        var f = String(v);
        item.formula = f.charAt(0) === "=" ? f : "=" + f;
      },
    });
    Object.defineProperty(ni, "value", { get: function () { return item.formula.slice(1); } });
    ni.delete = function () {
      count("name.delete");
      var i = book.names.indexOf(item);
      if (i >= 0) book.names.splice(i, 1);
    };
    ni.getRange = function () {
      var p = parseAddress(item.formula);
      var s = p && p.sheet !== null ? sheetByKey(p.sheet) : null;
      return s ? rangeProxy(ctx, s, p.rect) : missing(ctx, "range of name " + item.name);
    };
    ni.getRangeOrNullObject = function () {
      var p = parseAddress(item.formula);
      var s = p && p.sheet !== null ? sheetByKey(p.sheet) : null;
      return s ? rangeProxy(ctx, s, p.rect) : nullObject(ctx, "range of name " + item.name);
    };
    return ni;
  }

  // ---- settings -------------------------------------------------------------------------------

  function settingCollection(ctx) {
    var col = loader({});
    var proxy = function (k) {
      var s = loader({});
      Object.defineProperty(s, "key", { get: function () { return k; } });
      // Each read is a fresh copy, as the host stores settings as JSON.
      Object.defineProperty(s, "value", {
        get: function () { return JSON.parse(book.settings[k]); },
        set: function (v) { book.settings[k] = JSON.stringify(v); },
      });
      s.delete = function () {
        count("setting.delete");
        delete book.settings[k];
      };
      return s;
    };
    Object.defineProperty(col, "items", { get: function () { return Object.keys(book.settings).map(proxy); } });
    col.add = function (k, value) {
      count("settings.add");
      if (typeof k !== "string" || k === "") {
        ctx._fail(ErrorCodes.invalidArgument, "A setting needs a key.");
        return broken();
      }
      var json = JSON.stringify(value);
      if (json === undefined) {
        ctx._fail(ErrorCodes.invalidArgument, "The value of setting " + k + " cannot be stored.");
        return broken();
      }
      book.settings[k] = json;
      return proxy(k);
    };
    col.getItem = function (k) {
      return Object.prototype.hasOwnProperty.call(book.settings, k) ? proxy(k) : missing(ctx, "setting " + k);
    };
    col.getItemOrNullObject = function (k) {
      count("settings.getItemOrNullObject");
      return Object.prototype.hasOwnProperty.call(book.settings, k) ? proxy(k) : nullObject(ctx, "setting " + k);
    };
    col.onSettingsChanged = eventSource(ctx, [], "settings.onSettingsChanged");
    return col;
  }

  // ---- charts ---------------------------------------------------------------------------------

  var CHART_TYPES = [
    "ColumnClustered", "ColumnStacked", "ColumnStacked100", "BarClustered", "BarStacked", "BarStacked100",
    "Line", "LineStacked", "LineStacked100", "LineMarkers", "LineMarkersStacked", "LineMarkersStacked100",
    "Area", "AreaStacked", "AreaStacked100", "Pie", "Doughnut", "XYScatter", "XYScatterLines", "XYScatterLinesNoMarkers",
    "XYScatterSmooth", "XYScatterSmoothNoMarkers", "Radar", "RadarMarkers", "RadarFilled", "Bubble", "StockHLC",
  ];
  var LINE_STYLES = ["None", "Continuous", "Dash", "DashDot", "DashDotDot", "Dot", "Grey25", "Grey50", "Grey75", "Automatic", "RoundDot"];
  var LEGEND_POSITIONS = ["Invalid", "Top", "Bottom", "Left", "Right", "Corner", "Custom"];

  function newSeries(name) {
    return { name: name, chartType: null, values: null, categories: null, line: {}, fill: {} };
  }

  /**
   * The series Excel makes from a chart's source data, by columns: a first row of text holds
   * the series names; a first column of text (when there are other columns) the categories.
   */
  function seriesFromSource(sheet, rect) {
    var many = cols(rect) > 1;
    var text = function (r, c) {
      var v = valueAt(sheet, r, c);
      return typeof v === "string" && v !== "";
    };
    var header = rows(rect) > 1;
    for (var c = rect.left + (many ? 1 : 0); c <= rect.right; c++) if (!text(rect.top, c)) header = false;
    var firstData = header ? rect.top + 1 : rect.top;
    var catsCol = many;
    for (var r = firstData; r <= rect.bottom && catsCol; r++) if (typeof valueAt(sheet, r, rect.left) === "number") catsCol = false;
    var out = [];
    for (var col = rect.left + (catsCol ? 1 : 0); col <= rect.right; col++) {
      var s = newSeries(header ? String(valueAt(sheet, rect.top, col)) : "Series" + (out.length + 1));
      s.values = { sheetId: sheet.id, rect: { top: firstData, left: col, bottom: rect.bottom, right: col } };
      if (catsCol) s.categories = { sheetId: sheet.id, rect: { top: firstData, left: rect.left, bottom: rect.bottom, right: rect.left } };
      out.push(s);
    }
    return out;
  }

  function chartCollection(ctx, sheet) {
    var col = loader({});
    Object.defineProperty(col, "items", { get: function () { return sheet.charts.map(function (c) { return chartProxy(ctx, sheet, c); }); } });
    Object.defineProperty(col, "count", { get: function () { return sheet.charts.length; } });
    col.add = function (type, sourceData, seriesBy) {
      count("charts.add");
      if (!checkEnum(ctx, "chart type", type, CHART_TYPES)) return broken();
      if (seriesBy !== undefined && !checkEnum(ctx, "seriesBy", seriesBy, ["Auto", "Columns", "Rows"])) return broken();
      if (!sourceData || !sourceData._sheet) {
        ctx._fail(ErrorCodes.invalidArgument, "charts.add needs a range.");
        return broken();
      }
      book.charts++;
      var model = {
        id: "{CHART-" + book.charts + "}",
        name: "Chart " + book.charts,
        type: type,
        title: { text: "", visible: true },
        valueTitle: "",
        categoryTitle: "",
        legend: { visible: true, position: "Right" },
        at: null,
        width: 360,
        height: 216,
        series: seriesFromSource(sourceData._sheet, sourceData._rect),
      };
      sheet.charts.push(model);
      return chartProxy(ctx, sheet, model);
    };
    col.getItem = function (name) {
      var c = sheet.charts.filter(function (x) { return x.name === name; })[0];
      return c ? chartProxy(ctx, sheet, c) : missing(ctx, "chart " + name);
    };
    col.getItemOrNullObject = function (name) {
      var c = sheet.charts.filter(function (x) { return x.name === name; })[0];
      return c ? chartProxy(ctx, sheet, c) : nullObject(ctx, "chart " + name);
    };
    col.getItemAt = function (i) {
      return sheet.charts[i] ? chartProxy(ctx, sheet, sheet.charts[i]) : missing(ctx, "chart at " + i);
    };
    return col;
  }

  function titleProxy(get, set) {
    var t = {};
    Object.defineProperty(t, "text", { get: get, set: set });
    Object.defineProperty(t, "visible", { get: function () { return true; }, set: function () {} });
    t.format = { font: {} };
    return t;
  }

  function chartProxy(ctx, sheet, model) {
    var ch = loader({});
    ch._model = model;
    Object.defineProperty(ch, "id", { get: function () { return model.id; } });
    Object.defineProperty(ch, "name", {
      get: function () { return model.name; },
      set: function (v) { model.name = String(v); },
    });
    Object.defineProperty(ch, "chartType", {
      get: function () { return model.type; },
      set: function (v) {
        if (checkEnum(ctx, "chart type", v, CHART_TYPES)) model.type = v;
      },
    });
    ["width", "height", "top", "left"].forEach(function (f) {
      Object.defineProperty(ch, f, {
        get: function () { return model[f]; },
        set: function (v) {
          if (typeof v !== "number" || !(v >= 0)) ctx._fail(ErrorCodes.invalidArgument, "Chart " + f + " " + v + " is not a size.");
          else model[f] = v;
        },
      });
    });
    Object.defineProperty(ch, "worksheet", { get: function () { return worksheetProxy(ctx, sheet); } });
    ch.title = titleProxy(
      function () { return model.title.text; },
      function (v) { model.title.text = String(v); },
    );
    ch.axes = {
      valueAxis: { title: titleProxy(function () { return model.valueTitle; }, function (v) { model.valueTitle = String(v); }), format: { font: {} } },
      categoryAxis: { title: titleProxy(function () { return model.categoryTitle; }, function (v) { model.categoryTitle = String(v); }), format: { font: {} } },
    };
    var legend = { format: { font: {} } };
    Object.defineProperty(legend, "visible", { get: function () { return model.legend.visible; }, set: function (v) { model.legend.visible = Boolean(v); } });
    Object.defineProperty(legend, "position", {
      get: function () { return model.legend.position; },
      set: function (v) {
        if (checkEnum(ctx, "legend position", v, LEGEND_POSITIONS)) model.legend.position = v;
      },
    });
    ch.legend = legend;
    ch.setPosition = function (start, end) {
      count("chart.setPosition");
      var anchor = function (r) {
        if (typeof r === "string") {
          var p = parseAddress(r);
          return p ? { sheetId: sheet.id, rect: p.rect } : null;
        }
        return r && r._sheet ? { sheetId: r._sheet.id, rect: r._rect } : null;
      };
      var a = anchor(start);
      if (!a || a.sheetId !== sheet.id) {
        ctx._fail(ErrorCodes.invalidArgument, "Chart.setPosition needs a cell of the chart's sheet.");
        return;
      }
      model.at = rectA1(a.rect);
      if (end !== undefined) {
        var b = anchor(end);
        if (b) model.to = rectA1(b.rect);
      }
    };
    ch.delete = function () {
      count("chart.delete");
      var i = sheet.charts.indexOf(model);
      if (i >= 0) sheet.charts.splice(i, 1);
    };
    ch.series = seriesCollection(ctx, sheet, model);
    ch.format = { fill: { clear: function () {}, setSolidColor: function () {} }, font: {} };
    return ch;
  }

  function seriesCollection(ctx, sheet, chart) {
    var col = loader({});
    Object.defineProperty(col, "items", { get: function () { return chart.series.map(function (s) { return seriesProxy(ctx, chart, s); }); } });
    Object.defineProperty(col, "count", { get: function () { return chart.series.length; } });
    col.getCount = function () { return { value: chart.series.length }; };
    col.getItemAt = function (i) {
      var s = chart.series[i];
      return s ? seriesProxy(ctx, chart, s) : missing(ctx, "series " + i + " of " + chart.name);
    };
    col.add = function (name, index) {
      count("series.add");
      var s = newSeries(name === undefined ? "Series" + (chart.series.length + 1) : String(name));
      if (index === undefined || index >= chart.series.length) chart.series.push(s);
      else chart.series.splice(index, 0, s);
      return seriesProxy(ctx, chart, s);
    };
    return col;
  }

  function sourceOf(ctx, what, range) {
    if (!range || !range._sheet) {
      ctx._fail(ErrorCodes.invalidArgument, what + " needs a range.");
      return null;
    }
    var r = range._rect;
    if (r.top !== r.bottom && r.left !== r.right) {
      ctx._fail(ErrorCodes.invalidArgument, what + ": a series reads one row or one column, not " + rectA1(r) + ".");
      return null;
    }
    return { sheetId: range._sheet.id, rect: r };
  }

  function seriesProxy(ctx, chart, s) {
    var se = loader({});
    Object.defineProperty(se, "name", { get: function () { return s.name; }, set: function (v) { s.name = String(v); } });
    Object.defineProperty(se, "chartType", {
      get: function () { return s.chartType || chart.type; },
      set: function (v) {
        if (checkEnum(ctx, "series chart type", v, CHART_TYPES)) s.chartType = v;
      },
    });
    se.setValues = function (range) {
      count("series.setValues");
      var src = sourceOf(ctx, "ChartSeries.setValues", range);
      if (src) s.values = src;
    };
    se.setXAxisValues = function (range) {
      count("series.setXAxisValues");
      var src = sourceOf(ctx, "ChartSeries.setXAxisValues", range);
      if (src) s.categories = src;
    };
    se.getDimensionDataSourceString = function (dimension) {
      var src = dimension === "Categories" || dimension === "XValues" ? s.categories : s.values;
      var sheet = src ? sheetById(src.sheetId) : null;
      return { value: sheet ? quoteSheet(sheet.name) + "!" + rectA1(src.rect, true) : "" };
    };
    se.delete = function () {
      count("series.delete");
      var i = chart.series.indexOf(s);
      if (i >= 0) chart.series.splice(i, 1);
    };
    var line = {};
    Object.defineProperty(line, "lineStyle", {
      get: function () { return s.line.lineStyle; },
      set: function (v) {
        if (checkEnum(ctx, "line style", v, LINE_STYLES)) s.line.lineStyle = v;
      },
    });
    Object.defineProperty(line, "color", { get: function () { return s.line.color; }, set: function (v) { s.line.color = String(v); } });
    Object.defineProperty(line, "weight", {
      get: function () { return s.line.weight; },
      set: function (v) {
        if (typeof v !== "number" || !(v > 0)) ctx._fail(ErrorCodes.invalidArgument, "Line weight " + v + " is not a weight.");
        else s.line.weight = v;
      },
    });
    line.clear = function () {
      s.line = {};
    };
    var fill = {
      setSolidColor: function (c) {
        count("series.fill.setSolidColor");
        s.fill = { color: String(c) };
      },
      clear: function () {
        s.fill = { cleared: true };
      },
    };
    se.format = { line: line, fill: fill };
    return se;
  }

  // ---- the globals ------------------------------------------------------------------------------

  function run(a, b) {
    count("Excel.run");
    var batch = typeof a === "function" ? a : b;
    var ctx = a instanceof RequestContext ? a : new RequestContext();
    if (typeof batch !== "function") return Promise.reject(OfficeError(ErrorCodes.invalidArgument, "Excel.run needs a batch function."));
    var result;
    try {
      result = batch(ctx);
    } catch (e) {
      return Promise.reject(e);
    }
    if (!result || typeof result.then !== "function") {
      return Promise.reject(OfficeError(ErrorCodes.invalidArgument, 'The batch function passed to the ".run" method didn\'t return a promise.'));
    }
    return Promise.resolve(result).then(function (value) {
      // Commands queued after the batch's last sync still reach the host, and can still fail.
      if (ctx._error) {
        var e = ctx._error;
        ctx._error = null;
        throw e;
      }
      flushEvents();
      return value;
    });
  }

  /** "1.8" → [1, 8]; compared part by part, so 1.8 comes before 1.12. */
  function versionParts(v) {
    var m = /^(\d+)(?:\.(\d+))?$/.exec(String(v === undefined ? "1.1" : v).trim());
    return m ? [Number(m[1]), Number(m[2] || 0)] : null;
  }

  function atMost(v, limit) {
    var a = versionParts(v);
    var b = versionParts(limit);
    if (!a || !b) return false;
    return a[0] < b[0] || (a[0] === b[0] && a[1] <= b[1]);
  }

  function supports(set, version) {
    var name = String(set).toLowerCase();
    if (name === "excelapi") return atMost(version, SUPPORTED_EXCEL_API);
    if (name === "sharedruntime") return atMost(version, "1.1");
    if (name === "customfunctionsruntime") return atMost(version, "1.3");
    return false;
  }

  window.OfficeExtension = {
    Error: OfficeError,
    ErrorCodes: ErrorCodes,
    ClientRequestContext: RequestContext,
  };

  window.Excel = {
    run: run,
    RequestContext: RequestContext,
    ErrorCodes: ErrorCodes,
    ChartType: CHART_TYPES.reduce(function (o, t) {
      o[t.charAt(0).toLowerCase() + t.slice(1)] = t;
      return o;
    }, {}),
  };

  window.Office = {
    HostType: { Excel: "Excel", Word: "Word", PowerPoint: "PowerPoint", Outlook: "Outlook", OneNote: "OneNote", Project: "Project", Access: "Access" },
    PlatformType: { PC: "PC", OfficeOnline: "OfficeOnline", Mac: "Mac", iOS: "iOS", Android: "Android", Universal: "Universal" },
    onReady: function (callback) {
      count("Office.onReady");
      return opened.then(function () {
        var info = { host: "Excel", platform: "OfficeOnline" };
        if (typeof callback === "function") callback(info);
        return info;
      });
    },
    context: {
      host: "Excel",
      platform: "OfficeOnline",
      displayLanguage: "en-GB",
      contentLanguage: "en-GB",
      requirements: {
        isSetSupported: function (set, version) {
          count("isSetSupported");
          return supports(set, version);
        },
      },
    },
  };

  function CfError(code, message) {
    var e = new Error(message || "");
    e.code = code;
    Object.setPrototypeOf(e, CfError.prototype);
    return e;
  }
  CfError.prototype = Object.create(Error.prototype);
  window.CustomFunctions = {
    associate: function (id, f) {
      customFunctions[id] = f;
    },
    Error: CfError,
    ErrorCode: { invalidValue: "#VALUE!", notAvailable: "#N/A", divisionByZero: "#DIV/0!", invalidNumber: "#NUM!", nullReference: "#NULL!", invalidName: "#NAME?", invalidReference: "#REF!" },
  };

  // ---- the test's control surface ---------------------------------------------------------------

  function sheetOrThrow(name) {
    var s = sheetByKey(name);
    if (!s) throw new Error("__host: no sheet " + name);
    return s;
  }

  function rectOrThrow(address) {
    var p = parseLocal(address);
    if (!p) throw new Error("__host: cannot read the address " + address);
    return p;
  }

  function describeSource(src) {
    if (!src) return null;
    var sheet = sheetById(src.sheetId);
    return { sheet: sheet ? sheet.name : null, address: rectA1(src.rect), values: sheet ? grid(sheet, src.rect, valueAt).map(function (r) { return r[0]; }) : [] };
  }

  function reset() {
    book = newBook();
    pendingEvents = [];
    opened = new Promise(function (resolve) {
      openedResolve = resolve;
    });
  }
  reset();

  var host = {
    /** Errors thrown by the pane's event handlers (a real host would swallow them). */
    handlerErrors: function () {
      return errorsSeen.slice();
    },
    /** How often each host call was made since the last resetCalls(). */
    calls: function () {
      return Object.assign({}, calls);
    },

    /**
     * Opens a workbook: { name, sheets: [{ name, top?, left?, values, formats? }],
     * tables: [{ name, sheet, address, showHeaders?, showTotals? }], active?, selection? }.
     * Office.onReady resolves once a workbook is open.
     */
    open: function (model) {
      var fresh = newBook();
      book = fresh;
      book.name = model.name || "Book1.xlsx";
      (model.sheets || []).forEach(function (m) {
        var s = newSheet(m.name);
        book.sheets.push(s);
        var top = m.top || 0;
        var left = m.left || 0;
        (m.values || []).forEach(function (row, r) {
          row.forEach(function (v, c) {
            var f = m.formats && m.formats[r] ? m.formats[r][c] : undefined;
            if (f !== undefined && !isGeneral(f)) setFormat(s, top + r, left + c, f);
            if (v !== null && v !== undefined && v !== "") setValue(s, top + r, left + c, v);
          });
        });
      });
      (model.tables || []).forEach(function (m) {
        var s = sheetOrThrow(m.sheet);
        var r = rectOrThrow(m.address);
        book.tables.push({
          id: String(book.tables.length + 1),
          name: m.name,
          sheetId: s.id,
          top: r.top,
          left: r.left,
          bottom: r.bottom,
          right: r.right,
          showHeaders: m.showHeaders !== false,
          showTotals: m.showTotals === true,
          hiddenHeaders: [],
          changed: [],
        });
      });
      var active = model.active ? sheetOrThrow(model.active) : book.sheets[0];
      book.activeSheetId = active ? active.id : null;
      if (model.selection) host.select(model.selection.sheet, model.selection.address);
      else if (active) book.selection = { sheetId: active.id, rect: { top: 0, left: 0, bottom: 0, right: 0 } };
      openedResolve();
      return true;
    },

    select: function (sheet, address) {
      var s = sheetOrThrow(sheet);
      book.selection = { sheetId: s.id, rect: rectOrThrow(address) };
      book.activeSheetId = s.id;
    },

    /**
     * Types `values` (rows × columns) into `address` of `sheet` as a user would: text is parsed
     * as Excel parses entries; a block that starts in the row under a table and inside its
     * columns extends the table. Then the change events fire. Returns what happened.
     */
    edit: function (sheet, address, values, formats) {
      count("host.edit");
      var s = sheetOrThrow(sheet);
      var rect = rectOrThrow(address);
      if (!Array.isArray(values) || values.length !== rows(rect) || values.some(function (r) { return r.length !== cols(rect); })) {
        throw new Error("__host.edit: values do not fit " + address);
      }
      var grew = null;
      book.tables.forEach(function (t) {
        if (t.sheetId !== s.id || t.showTotals) return;
        if (rect.top === t.bottom + 1 && rect.left >= t.left && rect.left <= t.right) {
          // Excel's auto-expansion: the table takes the typed rows (and their formats from the row above).
          for (var r = rect.top; r <= rect.bottom; r++) {
            for (var c = t.left; c <= t.right; c++) {
              var above = formatAt(s, t.bottom, c);
              if (!isGeneral(above) && isGeneral(formatAt(s, r, c))) setFormat(s, r, c, above);
            }
          }
          t.bottom = rect.bottom;
          grew = t.name;
        }
      });
      for (var r = 0; r < values.length; r++) {
        for (var c = 0; c < values[r].length; c++) {
          var f = formats && formats[r] ? formats[r][c] : undefined;
          if (f !== undefined && f !== null) setFormat(s, rect.top + r, rect.left + c, f);
          var e = entered(values[r][c], formatAt(s, rect.top + r, rect.left + c));
          if (e.error) throw new Error("__host.edit: " + e.error);
          setValue(s, rect.top + r, rect.left + c, e.v, e.f);
        }
      }
      changed(s, rect, false);
      flushEvents();
      return { address: quoteSheet(s.name) + "!" + rectA1(rect), tableGrew: grew };
    },

    /** Types a row directly under a table (which then grows by it). */
    appendTableRow: function (table, values, formats) {
      var t = tableByKey(table);
      if (!t) throw new Error("__host: no table " + table);
      var s = sheetById(t.sheetId);
      var address = cellA1(t.bottom + 1, t.left) + ":" + cellA1(t.bottom + 1, t.left + values.length - 1);
      return host.edit(s.name, address, [values], formats ? [formats] : undefined);
    },

    sheetNames: function () {
      return book.sheets.map(function (s) { return s.name; });
    },
    activeSheet: function () {
      var s = sheetById(book.activeSheetId);
      return s ? s.name : null;
    },
    sheet: function (name) {
      var s = sheetOrThrow(name);
      return { name: s.name, id: s.id, tabColor: s.tabColor, widths: Object.assign({}, s.widths), handlers: s.changed.length };
    },

    /** Values and formats of `address` ("B20", "A1:C4") on `sheet`. */
    read: function (sheet, address) {
      var s = sheetOrThrow(sheet);
      var r = rectOrThrow(address);
      return { address: quoteSheet(s.name) + "!" + rectA1(r), values: grid(s, r, valueAt), formats: grid(s, r, formatAt) };
    },

    /** The sheet's values from A1 to the last used cell (valuesOnly), or [] when empty. */
    grid: function (sheet) {
      var s = sheetOrThrow(sheet);
      var u = usedRect(s, WHOLE_SHEET, true);
      return u ? grid(s, { top: 0, left: 0, bottom: u.bottom, right: u.right }, valueAt) : [];
    },

    /** Every stored cell of every sheet (values and formats), for comparing the book before and after. */
    snapshot: function () {
      var out = {};
      book.sheets.forEach(function (s) {
        var cells = [];
        s.cells.forEach(function (c, k) {
          cells.push([k, c.v === undefined ? "" : c.v, c.f === undefined ? "General" : c.f]);
        });
        cells.sort(function (a, b) { return a[0] - b[0]; });
        out[s.name] = { cells: cells, charts: host.charts(s.name) };
      });
      return { sheets: out, names: host.names(), settings: host.settings() };
    },

    usedRange: function (sheet) {
      var s = sheetOrThrow(sheet);
      var u = usedRect(s, WHOLE_SHEET, true);
      return u ? { address: rectA1(u), rowIndex: u.top, columnIndex: u.left, rowCount: rows(u), columnCount: cols(u) } : null;
    },

    names: function () {
      return book.names.map(function (n) { return { name: n.name, formula: n.formula }; });
    },

    /** Where a defined name points and what its cells hold. */
    nameRange: function (name) {
      var n = nameByKey(name);
      if (!n) return null;
      var p = parseAddress(n.formula);
      var s = p && p.sheet !== null ? sheetByKey(p.sheet) : null;
      if (!s) return { name: n.name, formula: n.formula, sheet: null, address: null, values: null };
      return { name: n.name, formula: n.formula, sheet: s.name, address: rectA1(p.rect), row: p.rect.top, col: p.rect.left, values: grid(s, p.rect, valueAt), formats: grid(s, p.rect, formatAt) };
    },

    /** Charts on one sheet (or all), each series with the sheet, address and values it reads. */
    charts: function (sheet) {
      var list = sheet ? [sheetOrThrow(sheet)] : book.sheets;
      var out = [];
      list.forEach(function (s) {
        s.charts.forEach(function (c) {
          out.push({
            id: c.id,
            name: c.name,
            sheet: s.name,
            type: c.type,
            title: c.title.text,
            valueTitle: c.valueTitle,
            categoryTitle: c.categoryTitle,
            legend: Object.assign({}, c.legend),
            at: c.at,
            width: c.width,
            height: c.height,
            series: c.series.map(function (x) {
              return {
                name: x.name,
                chartType: x.chartType || c.type,
                line: Object.assign({}, x.line),
                fill: Object.assign({}, x.fill),
                values: describeSource(x.values),
                categories: describeSource(x.categories),
              };
            }),
          });
        });
      });
      return out;
    },

    settings: function () {
      var out = {};
      Object.keys(book.settings).forEach(function (k) {
        out[k] = JSON.parse(book.settings[k]);
      });
      return out;
    },
    settingsBytes: function () {
      return Object.keys(book.settings).reduce(function (n, k) { return n + k.length + book.settings[k].length; }, 0);
    },

    tables: function () {
      return book.tables.map(function (t) {
        var s = sheetById(t.sheetId);
        return { name: t.name, id: t.id, sheet: s.name, address: rectA1(tableRect(t)), rows: rows(bodyRect(t)), columns: tableColumnNames(t), handlers: t.changed.length };
      });
    },

    /** Handlers registered on workbook events, by kind. */
    handlers: function () {
      return {
        calculated: book.calculated.length,
        sheets: book.sheets.reduce(function (n, s) { return n + s.changed.length; }, 0),
        tables: book.tables.reduce(function (n, t) { return n + t.changed.length; }, 0),
      };
    },

    functions: function () {
      return Object.keys(customFunctions).sort();
    },

    resetCalls: function () {
      Object.keys(calls).forEach(function (k) { delete calls[k]; });
    },

    /** A1 helpers the test may use, as the stand-in reads and writes addresses. */
    a1: { colLetters: colLetters, colIndex: colIndex, quoteSheet: quoteSheet, parseAddress: parseAddress, parseLocal: parseLocal },
  };

  window.__host = host;
})();
