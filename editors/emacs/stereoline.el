;;; stereoline.el --- Stereoline language server through eglot  -*- lexical-binding: t; -*-

;; Keywords: languages, tools
;; Package-Requires: ((emacs "27.1") (eglot "1.9"))

;;; Commentary:

;; Registers `stereoline serve' with eglot for SMILES list files (a
;; `smiles-mode' defined here for .smi, .smiles and .rsmi), JSON Lines
;; datasets (a `jsonl-mode' for .jsonl and .ndjson) and, if you ask for
;; it, for Python, CSV and Markdown buffers.
;;
;;   (add-to-list 'load-path "/path/to/stereoline/editors/emacs")
;;   (require 'stereoline)
;;   (setq stereoline-modes '(smiles-mode jsonl-mode python-mode))
;;   (stereoline-setup)
;;   (add-hook 'smiles-mode-hook #'eglot-ensure)
;;
;; Eglot 1.9 runs one server per buffer, so listing python-mode here
;; replaces another Python server in those buffers; that is why the
;; default is list files only.

;;; Code:

(require 'eglot)
(require 'js)

(defgroup stereoline nil
  "Stereo marks of SMILES checked by the stereoline language server."
  :group 'tools
  :prefix "stereoline-")

(defcustom stereoline-program "stereoline"
  "The stereoline program; it is started as PROGRAM serve."
  :type 'string)

(defcustom stereoline-modes '(smiles-mode jsonl-mode)
  "Major modes whose buffers eglot hands to stereoline.
For example (smiles-mode jsonl-mode python-mode csv-mode markdown-mode)."
  :type '(repeat symbol))

(defcustom stereoline-settings '(:inlayHints t)
  "The server's settings as a plist, the \"stereoline\" section.
Keys: :severity (a plist of code to \"error\", \"warning\",
\"information\", \"hint\" or \"off\"), :inlayHints, :drawingLens
\(\"lists\", \"everywhere\" or \"off\"), :detection
\(\"normal\" or \"names\"), :columns, :names (vectors of strings),
:files (a plist of pattern to host kind).  Sent as
initializationOptions and as the answer to workspace/configuration."
  :type 'plist)

;;; SMILES list files

(defconst smiles-font-lock-keywords
  ;; Earlier entries win: comments and titles first, so the notation
  ;; patterns below only colour the record itself.  Token classes after
  ;; the OpenSMILES specification.
  `(("^[ \t]*#.*$" . font-lock-comment-face)
    ("^[ \t]*[^# \t\n][^ \t\n]*[ \t]+\\(.+\\)$" 1 font-lock-string-face)
    ("@\\(?:TH[12]\\|AL[12]\\|SP[1-3]\\|TB[0-9]\\{1,2\\}\\|OH[0-9]\\{1,2\\}\\|@\\)?" . font-lock-keyword-face)
    ("[/\\]" . font-lock-keyword-face)
    ("[-=#$:~]" . font-lock-builtin-face)
    ("%[0-9][0-9]\\|[0-9]" . font-lock-constant-face)
    ("Cl\\|Br\\|[BCNOSPFI*bcnosp]" . font-lock-type-face))
  "Highlighting for `smiles-mode': stereo marks, bonds, ring digits, atoms.")

;;;###autoload
(define-derived-mode smiles-mode prog-mode "SMILES"
  "Major mode for SMILES and reaction SMILES lists: one record a line."
  (setq-local comment-start "# ")
  (setq-local comment-start-skip "#+[ \t]*")
  (setq-local font-lock-defaults '(smiles-font-lock-keywords t)))

;;;###autoload
(add-to-list 'auto-mode-alist '("\\.\\(?:smi\\|smiles\\|rsmi\\)\\'" . smiles-mode))

;;; JSON Lines datasets

;; One JSON value a line (.jsonl, .ndjson).  Emacs has no mode for them;
;; this one reads them as JavaScript does and gives eglot the language id
;; "jsonl".  Left alone when another package defines it.
(unless (fboundp 'jsonl-mode)
  (define-derived-mode jsonl-mode js-mode "JSONL"
    "Major mode for JSON Lines datasets: one JSON value a line."))

;;;###autoload
(add-to-list 'auto-mode-alist '("\\.\\(?:jsonl\\|ndjson\\)\\'" . jsonl-mode))

;;; eglot

(defvar stereoline--saved-configuration nil
  "The value of `eglot-workspace-configuration' before setup.")

(defun stereoline--initialization-options (_server)
  "The initializationOptions: `stereoline-settings'."
  (or stereoline-settings eglot--{}))

(defun stereoline--configuration (_server)
  "The workspace configuration eglot answers with: our section only.
Other servers' sections set in `eglot-workspace-configuration' before
`stereoline-setup' ran are kept."
  (cons (cons :stereoline (or stereoline-settings eglot--{}))
        (and (listp stereoline--saved-configuration)
             (assq-delete-all :stereoline (copy-sequence stereoline--saved-configuration)))))

;;;###autoload
(defun stereoline-setup ()
  "Register stereoline with eglot for each of `stereoline-modes'.
One entry per mode, hence one server per mode and project: eglot 1.9
sends every buffer of a server with the language id of the mode that
started it, and the server reads a buffer by its language id."
  (let ((contact (list stereoline-program "serve"
                       :initializationOptions #'stereoline--initialization-options)))
    (dolist (mode (reverse stereoline-modes))
      (setq eglot-server-programs
            (cons (cons mode contact)
                  (cl-remove-if (lambda (entry) (eq (car entry) mode)) eglot-server-programs)))))
  (unless (functionp (default-value 'eglot-workspace-configuration))
    (setq stereoline--saved-configuration (default-value 'eglot-workspace-configuration))
    (setq-default eglot-workspace-configuration #'stereoline--configuration)))

(provide 'stereoline)
;;; stereoline.el ends here
