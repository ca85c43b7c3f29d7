// Model stage: the statement parser, one class whose statements are read in files by family:
// parser.cpp (the statement loop, the token cursor, values and names), parse_settings.cpp
// (units, let, frequency, z0), parse_wires.cpp (wire, shape, conductors), parse_feeds.cpp
// (feed, load, coil), parse_ground.cpp (ground) and parse_chain.cpp (the feed chain:
// transformer and line). Internal to the model stage: wirefield/model.hpp is the public API.
#pragma once

#include <algorithm>
#include <functional>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "model/expression.hpp"
#include "model/lexer.hpp"
#include "model/ranges.hpp"
#include "model/units.hpp"
#include "wirefield/model.hpp"

namespace wirefield::model {

class Parser {
 public:
  Parser(std::string file, const std::vector<Override>& overrides);
  Model Parse(std::string_view text);

 private:
  struct OverrideEntry {
    std::string expression;
    std::string origin;  // the "file" of its errors: Override::origin, or "override NAME"
    bool used = false;
  };
  // A value as written, with its first token for messages about it.
  struct Measured {
    Value value;
    Token start;
  };
  // The conductor clauses of a wire, as read; checked against each other as they come.
  struct ConductorClauses {
    std::optional<std::string> material;
    std::optional<Token> material_token;
    std::optional<double> conductivity;
    std::optional<double> permeability;
    std::optional<Token> permeability_token;
  };
  // The insulation clause of a wire, as read (parse_wires.cpp): checked as its parts come,
  // completed against the wire's radius once all its clauses are read.
  struct InsulationClauses {
    std::optional<Token> word;  // `insulation`, once given
    std::optional<Token> preset;
    std::optional<Measured> thickness, outer_diameter, permittivity, loss_tangent;
    double thickness_m = 0.0;
    double outer_diameter_m = 0.0;
    double relative_permittivity = 1.0;
    double loss_tangent_value = 0.0;
  };
  // The size clauses of a wire, as read: one of radius, diameter, size (the cross-section)
  // and strand (one strand's diameter), with its value in SI, and strands=N.
  struct SizeClauses {
    std::optional<Token> clause;
    double value = 0.0;  // m for radius, diameter and strand; m^2 for size
    std::optional<Token> strands_token;
    int strands = 1;
  };
  // How a clause of the feed chain is checked (parse_chain.cpp).
  enum class ClauseCheck {
    kPositive,       // a value of `quantity` above 0, in the range of `kind`
    kNotNegative,    // a value of `quantity` of 0 or more, in the range of `kind`
    kPlainPositive,  // a plain number (what it is: `note`) above 0, in the range of `kind`
    kValue,          // an expression, checked by read_value
    kTokens,         // read by read_tokens, from the token after the word (or after its '=')
  };
  // One clause a statement of the feed chain accepts, as a row of its table.
  struct ChainClause {
    std::string word;
    bool equals = true;  // written word=VALUE, else word VALUE
    ClauseCheck check = ClauseCheck::kPositive;
    const Quantity* quantity = nullptr;  // kPositive, kNotNegative
    double bare_factor = 1.0;            // SI units per bare number (lengths: the `units` length)
    ValueKind kind = ValueKind::kResistanceOhm;
    std::string note{};  // kPositive: advice ending the message; kPlainPositive: the meaning
    // Clauses of one nonzero group on different sides exclude each other; `either` says so.
    int group = 0;
    int side = 0;
    std::string either{};
    bool hidden = false;  // accepted, but not offered as a spelling (a common mistake)
    std::function<void(double)> store{};
    std::function<void(const Token&, const Measured&)> read_value{};
    std::function<void(const Token&)> read_tokens{};
  };
  // A statement of the feed chain: its context, its clauses, and what ends the message for a
  // clause it does not know.
  struct ChainStatement {
    std::string context;
    std::string clause_list;
    // Reads a clause's '=VALUE' before checking that it is not given twice or beside a rival
    // (the transformer does), else after (the line).
    bool value_first = false;
    std::vector<ChainClause> clauses;
  };
  // A statement's new name, as its first clause.
  struct Named {
    std::string name;
    std::string context;      // how messages name the statement: "wire 'dip'"
    SourceLocation location;  // of the statement's word
    Token token;              // the name as written
  };
  // A statement's spec with its name and the location of its word filled in.
  template <typename Spec>
  static Spec Started(const Named& named) {
    Spec spec;
    spec.name = named.name;
    spec.location = named.location;
    return spec;
  }
  // The start of a transformer or line: its name, the feed it sits at.
  struct ChainHead {
    Named named;
    std::string feed;
  };

  // ---- token access (parser.cpp) -------------------------------------------------------
  const Token& Peek() const { return tokens_[std::min(pos_, tokens_.size() - 1)]; }
  const Token& Next() {
    const Token& t = Peek();
    if (pos_ + 1 < tokens_.size()) ++pos_;
    return t;
  }
  bool IsPunct(std::string_view p) const {
    return Peek().kind == TokenKind::kPunct && Peek().text == p;
  }
  bool IsWord(std::string_view w) const {
    return Peek().kind == TokenKind::kName && Peek().text == w;
  }
  SourceLocation Loc(const Token& t) const { return At(source_, t.column); }
  InputError Error(const Token& t, const std::string& message) const {
    return InputError(Loc(t), message);
  }
  InputError Expected(const std::string& context, const std::string& what) const;
  void ExpectPunct(std::string_view p, const std::string& context, const std::string& what);
  void ExpectEnd(const std::string& statement) const;
  bool IsDecimalComma() const;
  InputError DecimalCommaError() const;
  static std::string Line(const SourceLocation& l);

  // ---- values at their use sites (parser.cpp) ------------------------------------------
  Measured Expression();
  double As(const Measured& m, const Quantity& q, double bare_unit_factor,
            const std::string& what) const;
  void InRange(ValueKind kind, double v, const Measured& m, const std::string& what) const;
  double Plain(const Measured& m, const std::string& what, const std::string& meaning) const;
  double Positive(const Measured& m, const Quantity& q, ValueKind kind, const std::string& context,
                  const std::string& what, const std::string& advice,
                  double bare_unit_factor = 1.0) const;

  // ---- names (parser.cpp) --------------------------------------------------------------
  std::string Name(const std::string& statement, const std::string& what);
  void CheckNew(const std::map<std::string, SourceLocation>& defined, const std::string& kind,
                const std::string& name, const Token& at) const;
  Named NewName(const Token& keyword, const std::string& statement, const std::string& kind,
                const std::string& usage, const std::map<std::string, SourceLocation>& names);
  void Statement();

  // ---- settings (parse_settings.cpp) ---------------------------------------------------
  void Units();
  void Let();
  Value OverrideValue(const std::string& name, OverrideEntry* entry);
  void Frequency(const Token& keyword);
  void Z0(const Token& keyword);

  // ---- wires and shapes (parse_wires.cpp) ----------------------------------------------
  Point ParsePoint(const std::string& context, const std::string& which);
  Point Corner(const std::string& context, const std::string& which, size_t corner,
               std::vector<WireTap>* taps);
  void Coordinates(const std::string& context, const std::string& which, size_t count, double* out);
  std::vector<Point> ThroughPoints(const std::string& context,
                                   std::vector<SourceLocation>* written_at = nullptr,
                                   std::vector<WireTap>* taps = nullptr);
  void Wire(const Token& keyword);
  void WireClauses(const std::string& context, std::optional<double> known_length_m, WireSpec* wire,
                   const std::function<bool()>& extra_clause = nullptr,
                   const std::string& clause_help =
                       "after the points come 'radius R' (or 'diameter D') and the optional "
                       "'segments N', 'material NAME' or 'conductivity=SIGMA "
                       "[permeability=MU_R]', and 'insulation PLASTIC thickness=T'");
  bool SizeClause(const std::string& context, SizeClauses* size, WireSpec* wire);
  void Strands(const std::string& context, SizeClauses* size);
  void StrandedSize(const std::string& context, const SizeClauses& size,
                    std::optional<double> known_length_m, WireSpec* wire);
  std::optional<double> WrittenNumber(size_t from) const;
  void CheckRadius(const std::string& context, const WireSpec& wire, double length_m) const;
  void AddWire(WireSpec wire);
  void Shape(const Token& keyword);
  void Conductor(const std::string& context, ConductorClauses* c);
  static std::string MaterialList();
  bool IsInsulationWord() const;
  void Insulation(const std::string& context, InsulationClauses* c);
  void InsulationPart(const std::string& context, InsulationClauses* c);
  void ApplyInsulation(const std::string& context, const InsulationClauses& c, WireSpec* wire);

  // ---- feeds and loads (parse_feeds.cpp) -----------------------------------------------
  WirePointSpec WirePoint(const std::string& context);
  WirePointSpec AtWirePoint(const std::string& context);
  void Feed(const Token& keyword);
  void Load(const Token& keyword);
  CoilSpec CoilClauses(const std::string& context);
  ChokeSpec ChokeClauses(const std::string& context);
  ChokePoint ChokeTablePoint(const std::string& context);
  CoilSpec CheckCoil(const std::string& context, CoilSpec coil,
                     const std::map<std::string, Token>& given, std::optional<double> target_h);
  bool IsCloseWound() const;
  void LoadWarnings(const LoadSpec& load);

  // ---- ground (parse_ground.cpp) -------------------------------------------------------
  void Ground(const Token& keyword);
  void RealGround(GroundSpec* ground);
  const GroundPreset* PresetSetting();
  GroundMethod MethodSetting();
  static std::string PresetList();

  // ---- the feed chain: transformer and line (parse_chain.cpp) ---------------------------
  std::string ChainFeed(const std::string& context);
  ChainHead ReadChainHead(
      const Token& keyword, const std::string& statement, const std::string& usage,
      const std::map<std::string, SourceLocation>& names,
      const std::map<std::string, std::pair<std::string, SourceLocation>>& at_feed);
  std::map<std::string, Token> ReadChainClauses(const ChainStatement& statement);
  std::optional<Measured> ChainClauseValue(const ChainStatement& statement,
                                           const ChainClause& clause, const Token& word);
  void CheckChainClause(const ChainStatement& statement, const ChainClause& clause,
                        const Token& word, const std::map<std::string, Token>& given) const;
  void ApplyChainClause(const ChainStatement& statement, const ChainClause& clause,
                        const Token& word, const std::optional<Measured>& m);
  void Transformer(const Token& keyword);
  void Turns(const std::string& context, TransformerSpec* t);
  void CoreAl(const std::string& context, const Measured& m, TransformerSpec* t) const;
  InputError RatioError(const std::string& context, const Token& ratio);
  void FeedLine(const Token& keyword);
  void Cable(const std::string& context, FeedLineSpec* line);
  void Loss(const std::string& context, const Token& clause, FeedLineSpec* line);
  static std::string CableList();
  static std::string CableHint(const std::string& written);

  std::string file_;
  Model model_;
  Scope scope_;
  std::map<std::string, OverrideEntry> overrides_;
  std::map<std::string, SourceLocation> wire_lines_, feed_lines_, load_lines_;
  // Names of transformers and lines (each kind its own namespace), and what sits at a feed.
  std::map<std::string, SourceLocation> transformer_lines_, line_lines_;
  std::map<std::string, std::pair<std::string, SourceLocation>> feed_transformer_, feed_line_;
  std::map<std::string, size_t> wire_index_;
  std::optional<SourceLocation> ground_line_, frequency_line_, z0_line_;
  std::optional<Token> radius_start_;  // the radius value of the wire being read
  double length_factor_ = 1.0;         // metres per bare length number (the `units` statement)
  LineSource source_;
  std::vector<Token> tokens_;
  size_t pos_ = 0;
  size_t statements_ = 0;
};

}  // namespace wirefield::model
