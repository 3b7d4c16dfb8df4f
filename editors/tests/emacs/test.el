;;; test.el --- drive eglot against stereoline serve in batch mode  -*- lexical-binding: t; -*-

;; Run: emacs --batch -l editors/tests/emacs/test.el
;; with STEREOLINE_BIN (the server binary), STEREOLINE_WORK (a scratch
;; copy of the fixtures) and STEREOLINE_EMACS (editors/emacs).  Opens the
;; Python fixture, the .smi list and the JSON Lines dataset through the
;; set-up in editors/emacs, waits for the pushed diagnostics, checks
;; their codes and lines and the hover text, then shuts the server down
;; and checks its exit status.
;; Each check prints "ok" or "not ok"; the exit status is the number of
;; failed checks.

;;; Code:

(package-initialize)
(require 'eglot)
(require 'cl-lib)
(add-to-list 'load-path (getenv "STEREOLINE_EMACS"))
(require 'stereoline)

(defvar st-failed 0)
(defvar st-work (file-name-as-directory (getenv "STEREOLINE_WORK")))

(defun st-check (ok what &optional detail)
  "Print OK or NOT OK for WHAT, with DETAIL when it failed."
  (if ok
      (princ (format "  ok     %s\n" what))
    (setq st-failed (1+ st-failed))
    (princ (format "  not ok %s%s\n" what (if detail (format ": %s" detail) ""))))
  ok)

(defun st-wait (pred seconds)
  "Let process output arrive until PRED is true or SECONDS pass."
  (let ((deadline (+ (float-time) seconds)))
    (while (and (not (funcall pred)) (< (float-time) deadline))
      (accept-process-output nil 0.05))
    (funcall pred)))

(defun st-diagnostics ()
  "The current buffer's diagnostics as (CODE . LINE), LINE 1-based."
  (mapcar (lambda (d)
            (let* ((lsp (alist-get 'eglot-lsp-diag (flymake-diagnostic-data d))))
              (cons (plist-get lsp :code)
                    (line-number-at-pos (flymake-diagnostic-beg d)))))
          eglot--diagnostics))

(defun st-hover-at (text)
  "Hover text at the first occurrence of TEXT in the current buffer."
  (goto-char (point-min))
  (if (not (search-forward text nil t))
      (format "no %S in buffer" text)
    (goto-char (match-beginning 0))
    (let* ((r (jsonrpc-request (eglot-current-server) :textDocument/hover
                               (eglot--TextDocumentPositionParams)))
           (c (plist-get r :contents)))
      (cond ((stringp c) c)
            ((plist-get c :value))
            (t (format "%S" r))))))

(defvar st-servers nil "The servers started, one per major mode.")

(defun st-open (name)
  "Visit NAME from the scratch directory; start eglot for it if needed."
  (find-file (concat st-work name))
  (unless (eglot-current-server)
    (apply #'eglot (eglot--guess-contact)))
  (st-wait (lambda () eglot--managed-mode) 10)
  (when (eglot-current-server)
    (cl-pushnew (eglot-current-server) st-servers)))

(setq stereoline-program (getenv "STEREOLINE_BIN")
      stereoline-modes '(smiles-mode jsonl-mode python-mode)
      stereoline-settings '(:inlayHints t)
      eglot-sync-connect t
      eglot-autoshutdown nil)
(stereoline-setup)

;; Python file
(princ "python file\n")
(st-open "sample.py")
(st-check (eq major-mode 'python-mode) "sample.py is in python-mode" major-mode)
(st-check eglot--managed-mode "eglot manages the Python buffer")
(st-wait (lambda () (>= (length eglot--diagnostics) 2)) 10)
(let ((diags (st-diagnostics)))
  ;; Python Language Reference, string literals: "\F" is no escape Python
  ;; knows, so the plain string does not hold the text as written.
  (st-check (member '("host-escape" . 4) diags) "diagnostic host-escape on line 4" diags)
  ;; IUPAC 2013 P-92: two identical ligands (two methyl groups): no
  ;; stereocentre, so the mark has no effect.
  (st-check (member '("stereo-ineffective-center" . 7) diags)
            "diagnostic stereo-ineffective-center on line 7" diags))
;; (R)-lactic acid, worked by hand from the CIP rules (IUPAC 2013 P-92):
;; O > COOH > CH3 > H, clockwise with H away; Hill formula C3H6O3.
(let ((h (st-hover-at "@@")))
  (st-check (string-search "(R)" h) "hover on the lactate mark says (R)" h)
  (st-check (string-search "C3H6O3" h) "hover on the lactate mark gives C3H6O3" h))

;; List file
(princ "list file\n")
(st-open "sample.smi")
(st-check (eq major-mode 'smiles-mode) "sample.smi is in smiles-mode" major-mode)
;; smiles-mode's highlighting: token classes after the OpenSMILES
;; specification (chirality and direction marks, bonds, atoms), titles.
(font-lock-ensure)
(dolist (c '(("@@" 0 font-lock-keyword-face)
             ("F/C=C/F" 1 font-lock-keyword-face)
             ("F/C=C/F" 3 font-lock-builtin-face)
             ("F/C=C/F" 2 font-lock-type-face)
             ("lactate-demo" 0 font-lock-string-face)
             ("# Invented" 0 font-lock-comment-face)))
  (goto-char (point-min))
  (let* ((found (search-forward (nth 0 c) nil t))
         (face (and found (get-text-property (+ (match-beginning 0) (nth 1 c)) 'face))))
    (st-check (eq face (nth 2 c)) (format "face at %S+%d is %s" (nth 0 c) (nth 1 c) (nth 2 c)) face)))
(st-check eglot--managed-mode "eglot manages the list buffer")
(st-wait (lambda () (>= (length eglot--diagnostics) 2)) 10)
(let ((diags (st-diagnostics)))
  (st-check (member '("stereo-ineffective-center" . 4) diags)
            "diagnostic stereo-ineffective-center on line 4" diags)
  ;; OpenSMILES specification, cis/trans double bonds: a mark on one side
  ;; only leaves the configuration open.
  (st-check (member '("stereo-one-sided-bond" . 5) diags)
            "diagnostic stereo-one-sided-bond on line 5" diags))
(let ((h (st-hover-at "@@")))
  (st-check (string-search "(R)" h) "hover on the lactate mark says (R)" h))
;; OpenSMILES: F/C=C/F is trans; F ranks first on each carbon, so (E)
;; (IUPAC 2013 P-93).
(let ((h (st-hover-at "=C/F")))
  (st-check (string-search "(E)" h) "hover on the difluoroethene double bond says (E)" h))

;; JSON Lines dataset
(princ "json lines file\n")
(st-open "sample.jsonl")
(st-check (eq major-mode 'jsonl-mode) "sample.jsonl is in jsonl-mode" major-mode)
(st-check eglot--managed-mode "eglot manages the JSON Lines buffer")
(st-wait (lambda () (assoc "list-enantiomer" (st-diagnostics))) 10)
;; The two records are (R)- and (S)-lactic acid: mirror images (IUPAC
;; 2013 P-93), one line each.
(let ((diags (st-diagnostics)))
  (st-check (member '("list-enantiomer" . 2) diags)
            "diagnostic list-enantiomer on line 2" diags))

;; Shutdown: shutdown then exit must end each process with status 0
;; (LSP 3.17, "exit").  Done by hand: eglot-shutdown deletes the process
;; right after sending exit, which would hide the server's own status.
(princ "shutdown\n")
(dolist (server st-servers)
  (let ((proc (jsonrpc--process server))
        (name (format "%s" (eglot--major-modes server))))
    (setf (eglot--shutdown-requested server) t)
    (jsonrpc-request server :shutdown nil :timeout 5)
    (jsonrpc-notify server :exit nil)
    (st-wait (lambda () (not (process-live-p proc))) 5)
    (st-check (and (not (process-live-p proc)) (eq (process-exit-status proc) 0))
              (format "server for %s exited with status 0" name)
              (format "%s, status %s" (process-status proc) (process-exit-status proc)))
    (ignore-errors (jsonrpc-shutdown server t))))

(kill-emacs st-failed)
;;; test.el ends here
